import type { Knex } from "knex";
import type { SessionUser } from "@/lib/auth/guards";
import { hitLimit, RESET_ACCOUNT_LIMIT, RESET_ADDRESS_LIMIT } from "@/lib/auth/rate-limit";
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
  // the account, its token and the entry commit together; the mail goes out after
  const { id, token } = await db.transaction(async (trx) => {
    const id = await insertUser(trx, { ...input, passwordHash: null });
    const token = await issuePasswordToken(trx, id, "invite");
    await appendAudit(trx, { actorUserId: actor.id, actorLabel: actor.email, action: "user.invite", details: { userId: id, role: input.role } });
    return { id, token };
  });
  const mail = inviteMail({ name: input.name, role: input.role, invitedBy: actor.name, link: `${env.NEXTAUTH_URL}/reset/${token}` });
  await sendMail({ to: input.email, ...mail, template: "invite" });
  const user = await findUserById(db, id);
  if (!user) throw new Error("inviteUser: the new account vanished");
  return user;
}

/** Sets a user's role and active flag. An admin cannot remove their own admin role or lock themselves out. */
export async function changeUser(db: Knex, actor: SessionUser, userId: number, input: UpdateUserInput): Promise<User> {
  if (userId === actor.id && (input.role !== "admin" || !input.active)) throw forbidden("You cannot remove your own admin access.");
  await db.transaction(async (trx) => {
    const current = await trx("users").where({ id: userId }).forUpdate().first<{ role: string } | undefined>("role");
    if (!current) throw notFound("No such user.");
    let membershipsRemoved = 0;
    if (input.role !== "researcher") {
      // Only researchers sit on study teams: a researcher who becomes a reviewer (or admin) leaves
      // every team, so they cannot keep reading trial data or decide on a study they worked on.
      const owned = await trx("studies").where({ owner_id: userId }).count<{ n: number }[]>({ n: "*" });
      if (Number(owned[0]?.n ?? 0) > 0) throw conflict(`This researcher owns ${owned[0]!.n} stud${Number(owned[0]!.n) === 1 ? "y" : "ies"}; another owner must take them over before the role can change.`);
      membershipsRemoved = await trx("study_members").where({ user_id: userId }).delete();
    }
    await updateUserRole(trx, userId, input.role, input.active);
    await appendAudit(trx, { actorUserId: actor.id, actorLabel: actor.email, action: "user.change", details: { userId, ...input, previousRole: current.role, membershipsRemoved } });
  });
  const user = await findUserById(db, userId);
  if (!user) throw notFound("No such user.");
  return user;
}

/**
 * Starts a password reset (startPasswordReset) and returns before anything that depends on the
 * account is done: the request is counted against the account's and the address's reset limits
 * (the same two counters whether or not the account exists), and within them the reset itself
 * (requestPasswordReset: look-up, token, mail) runs afterwards, unawaited. So the answer takes the
 * same time and says the same words for an existing and an unknown address, and a slow or failing
 * mail server cannot tell them apart either.
 */
export async function startPasswordReset(db: Knex, email: string, address: string, work: (db: Knex, email: string) => Promise<void> = requestPasswordReset): Promise<void> {
  const account = await hitLimit(db, RESET_ACCOUNT_LIMIT, email);
  const from = await hitLimit(db, RESET_ADDRESS_LIMIT, address);
  if (!account.within || !from.within) return;
  void work(db, email).catch((e: unknown) => console.error("password reset: could not send", e));
}

/** Mails a reset link when the account exists; says nothing either way (no account discovery). */
export async function requestPasswordReset(db: Knex, email: string): Promise<void> {
  const row = await findUserRowByEmail(db, email);
  if (!row || !row.active) return;
  const token = await db.transaction(async (trx) => {
    const token = await issuePasswordToken(trx, row.id, "reset");
    await appendAudit(trx, { actorUserId: row.id, actorLabel: row.email, action: "user.reset_requested", details: {} });
    return token;
  });
  const mail = passwordResetMail({ name: row.name, link: `${env.NEXTAUTH_URL}/reset/${token}` });
  await sendMail({ to: row.email, ...mail, template: "reset" });
}
