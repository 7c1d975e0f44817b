import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { hashPassword } from "@/lib/auth/password";
import { hashToken, newToken } from "@/lib/auth/tokens";
import type { PasswordTokenRow } from "@/lib/data/rows";
import { appendAudit } from "@/lib/data/audit";
import { setUserPassword } from "@/lib/data/users";

export const TOKEN_LIFETIME_MS = 60 * 60 * 1000;

/** Makes a single-use token for a password reset or an invitation; only its hash is stored. */
export async function issuePasswordToken(db: Queryable, userId: number, purpose: "reset" | "invite", now = new Date()): Promise<string> {
  const { token, hash } = newToken();
  await db("password_tokens").insert({ user_id: userId, token_hash: hash, purpose, expires_at: new Date(now.getTime() + TOKEN_LIFETIME_MS) });
  return token;
}

/** The token's row when it is unused and unexpired, else undefined. */
export async function findUsableToken(db: Knex, token: string, now = new Date()): Promise<PasswordTokenRow | undefined> {
  const row = await db<PasswordTokenRow>("password_tokens").where({ token_hash: hashToken(token) }).first();
  if (!row || row.used_at || row.expires_at.getTime() <= now.getTime()) return undefined;
  return row;
}

/**
 * Sets the password with a token, once: the token is marked used in the same transaction, and a
 * second use (or a concurrent one) finds it used.
 * @returns the user's id, or null when the token is unknown, used or expired.
 */
export async function consumePasswordToken(db: Knex, token: string, password: string, now = new Date()): Promise<number | null> {
  const passwordHash = await hashPassword(password);
  return db.transaction(async (trx) => {
    const claimed = await trx("password_tokens")
      .where({ token_hash: hashToken(token) })
      .whereNull("used_at")
      .andWhere("expires_at", ">", now)
      .update({ used_at: now });
    if (claimed !== 1) return null;
    const row = await trx<PasswordTokenRow>("password_tokens").where({ token_hash: hashToken(token) }).first();
    if (!row) return null;
    await setUserPassword(trx, row.user_id, passwordHash); // ends the user's existing sessions
    // Any other open tokens of this user stop working too.
    await trx("password_tokens").where({ user_id: row.user_id }).whereNull("used_at").update({ used_at: now });
    // the new password and its entry commit together
    await appendAudit(trx, { actorUserId: row.user_id, actorLabel: `user ${row.user_id}`, action: "user.password_set", details: {} });
    return row.user_id;
  });
}
