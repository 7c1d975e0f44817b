import type { Queryable } from "@/lib/db";
import { roleSchema, type Role } from "@/lib/auth/roles";
import type { UserRow } from "./rows";

export type User = { id: number; email: string; name: string; role: Role; active: boolean; hasPassword: boolean; createdAt: Date; sessionVersion: number };

export function toUser(row: UserRow): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: roleSchema.parse(row.role),
    active: Boolean(row.active),
    hasPassword: row.password_hash !== null,
    createdAt: row.created_at,
    sessionVersion: Number(row.session_version ?? 0),
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

/**
 * Sets a user's role and active flag; a deactivation or a role change raises the session version,
 * which ends the user's existing sessions (lib/session.ts).
 */
export async function updateUserRole(q: Queryable, id: number, role: Role, active: boolean): Promise<number> {
  return q("users").where({ id }).update({
    session_version: q.raw("IF(role <> ? OR ? = 0, session_version + 1, session_version)", [role, active ? 1 : 0]),
    role, active, updated_at: q.fn.now(3),
  });
}

/** Sets a password and ends every existing session of the user (session version raised). */
export async function setUserPassword(q: Queryable, id: number, passwordHash: string): Promise<void> {
  await q("users").where({ id }).update({ password_hash: passwordHash, session_version: q.raw("session_version + 1"), updated_at: q.fn.now(3) });
}
