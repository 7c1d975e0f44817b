import type { Queryable } from "@/lib/db";
import { hashToken } from "@/lib/auth/tokens";
import { planOf, requireSession, type SessionContext } from "./participants";

/** How long a session read for an upload is reused, and how many are kept. */
export const UPLOAD_SESSION_TTL_MS = 30_000;
export const UPLOAD_SESSION_MAX = 2_000;

const remembered = new Map<string, { ctx: SessionContext; at: number }>();

/**
 * The session for a sequence upload (requireUploadSession): a session runs dozens of uploads in a
 * few minutes, so a consented session read from the database is reused for up to
 * UPLOAD_SESSION_TTL_MS. Safe only because what could change meanwhile is checked again where it
 * matters: the record_sequence procedure refuses a withdrawn participant under the row lock, and
 * the participant's plan (condition order, design) does not change after consent. Sessions
 * without a plan (not yet consented) and withdrawn ones are never kept; keys are token hashes.
 * @throws AppError 404 for an unknown token (from requireSession).
 */
export async function requireUploadSession(q: Queryable, token: string, now = Date.now()): Promise<SessionContext> {
  const key = hashToken(token);
  const hit = remembered.get(key);
  if (hit && now - hit.at < UPLOAD_SESSION_TTL_MS) return hit.ctx;
  remembered.delete(key);
  const ctx = await requireSession(q, token);
  if (ctx.participant.status !== "withdrawn" && planOf(ctx) !== null) {
    if (remembered.size >= UPLOAD_SESSION_MAX) remembered.delete(remembered.keys().next().value!);
    remembered.set(key, { ctx, at: now });
  }
  return ctx;
}

/** Drops a remembered session (after a refusal, so the next request reads the row again). */
export function forgetUploadSession(token: string): void {
  remembered.delete(hashToken(token));
}
