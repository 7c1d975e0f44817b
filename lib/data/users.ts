import type { Queryable } from "@/lib/db";
import { roleSchema, type Role } from "@/lib/auth/roles";
import type { UserRow } from "./rows";

export type User = { id: number; email: string; name: string; role: Role; active: boolean; hasPassword: boolean; createdAt: Date };

export function toUser(row: UserRow): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: roleSchema.parse(row.role),
    active: Boolean(row.active),
    hasPassword: row.password_hash !== null,
    createdAt: row.created_at,
  };
}

export const normaliseEmail = (email: string) => email.trim().toLowerCase();

export async function findUserRowByEmail(q: Queryable, email: string): Promise<UserRow | undefined> {
  return q<UserRow>("users").where({ email: normaliseEmail(email) }).first();
}

export async function findUserById(q: Queryable, id: number): Promise<User | undefined> {
  const row = await q<UserRow>("users").where({ id }).first();
  return row ? toUser(row) : undefined;
}

export async function listUsers(q: Queryable): Promise<User[]> {
  const rows = await q<UserRow>("users").orderBy([{ column: "role" }, { column: "name" }]);
  return rows.map(toUser);
}

export async function insertUser(
  q: Queryable,
  user: { email: string; name: string; role: Role; passwordHash: string | null },
): Promise<number> {
  const [id] = await q("users").insert({
    email: normaliseEmail(user.email),
    name: user.name.trim(),
    role: user.role,
    password_hash: user.passwordHash,
  });
  return Number(id);
}

export async function updateUserRole(q: Queryable, id: number, role: Role, active: boolean): Promise<number> {
  return q("users").where({ id }).update({ role, active, updated_at: q.fn.now(3) });
}

export async function setUserPassword(q: Queryable, id: number, passwordHash: string): Promise<void> {
  await q("users").where({ id }).update({ password_hash: passwordHash, updated_at: q.fn.now(3) });
}
