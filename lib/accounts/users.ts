import type { Knex } from "knex";
import type { SessionUser } from "@/lib/auth/guards";
import { appendAudit } from "@/lib/data/audit";
import { findUserById, findUserRowByEmail, insertUser, updateUserRole, type User } from "@/lib/data/users";
import { conflict, forbidden, notFound } from "@/lib/errors";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { inviteMail, passwordResetMail } from "@/lib/mail/templates";
import type { InviteUserInput, UpdateUserInput } from "@/lib/schemas/users";
import { issuePasswordToken } from "./password-tokens";

/** Creates an account without a password and mails a single-use link to choose one. */
export async function inviteUser(db: Knex, actor: SessionUser, input: InviteUserInput): Promise<User> {
  if (await findUserRowByEmail(db, input.email)) throw conflict("An account with this e-mail exists already.");
  const id = await insertUser(db, { ...input, passwordHash: null });
  const token = await issuePasswordToken(db, id, "invite");
  const mail = inviteMail({ name: input.name, role: input.role, invitedBy: actor.name, link: `${env.NEXTAUTH_URL}/reset/${token}` });
  await sendMail({ to: input.email, ...mail, template: "invite" });
  await appendAudit(db, { actorUserId: actor.id, actorLabel: actor.email, action: "user.invite", details: { userId: id, role: input.role } });
  const user = await findUserById(db, id);
  if (!user) throw new Error("inviteUser: the new account vanished");
  return user;
}

/** Sets a user's role and active flag. An admin cannot remove their own admin role or lock themselves out. */
export async function changeUser(db: Knex, actor: SessionUser, userId: number, input: UpdateUserInput): Promise<User> {
  if (userId === actor.id && (input.role !== "admin" || !input.active)) throw forbidden("You cannot remove your own admin access.");
  const changed = await updateUserRole(db, userId, input.role, input.active);
  if (changed !== 1) throw notFound("No such user.");
  await appendAudit(db, { actorUserId: actor.id, actorLabel: actor.email, action: "user.change", details: { userId, ...input } });
  const user = await findUserById(db, userId);
  if (!user) throw notFound("No such user.");
  return user;
}

/** Mails a reset link when the account exists; says nothing either way (no account discovery). */
export async function requestPasswordReset(db: Knex, email: string): Promise<void> {
  const row = await findUserRowByEmail(db, email);
  if (!row || !row.active) return;
  const token = await issuePasswordToken(db, row.id, "reset");
  const mail = passwordResetMail({ name: row.name, link: `${env.NEXTAUTH_URL}/reset/${token}` });
  await sendMail({ to: row.email, ...mail, template: "reset" });
  await appendAudit(db, { actorUserId: row.id, actorLabel: row.email, action: "user.reset_requested", details: {} });
}
