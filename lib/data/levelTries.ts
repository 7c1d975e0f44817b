import type { Queryable } from "@/lib/db";
import { hashToken, newToken } from "@/lib/auth/tokens";
import { TRY_TTL_MS, trySetupSchema, type TrySetup, type TrySetupInput } from "@/lib/study/trySetup";

/**
 * Stores a level to try (createLevelTry): a fresh token (only its SHA-256 is kept), the validated
 * setup and an expiry an hour away. Returns the token for the /try/<token> address.
 * @throws ZodError for a setup that is not a valid configuration and task.
 */
export async function createLevelTry(q: Queryable, studyId: number, createdBy: number | null, input: TrySetupInput, now = new Date()): Promise<{ token: string; expiresAt: Date }> {
  const setup = trySetupSchema.parse(input);
  const { token, hash } = newToken(16);
  const expiresAt = new Date(now.getTime() + TRY_TTL_MS);
  await q("level_tries").insert({ token_hash: hash, study_id: studyId, created_by: createdBy, label: setup.label, setup: JSON.stringify(setup), expires_at: expiresAt });
  return { token, expiresAt };
}

export type FoundLevelTry = { ok: true; setup: TrySetup; expiresAt: Date } | { ok: false; reason: "unknown" | "expired" };

/** The setup of an unexpired try (fetchLevelTry), validated again as stored JSON; otherwise why not. */
export async function fetchLevelTry(q: Queryable, token: string, now = new Date()): Promise<FoundLevelTry> {
  if (!/^[A-Za-z0-9_-]{16,64}$/.test(token)) return { ok: false, reason: "unknown" };
  const row = await q("level_tries").where({ token_hash: hashToken(token) }).first<{ setup: unknown; expires_at: Date } | undefined>("setup", "expires_at");
  if (!row) return { ok: false, reason: "unknown" };
  if (row.expires_at.getTime() <= now.getTime()) return { ok: false, reason: "expired" };
  const raw = typeof row.setup === "string" ? JSON.parse(row.setup) : row.setup;
  return { ok: true, setup: trySetupSchema.parse(raw), expiresAt: row.expires_at };
}

/** Deletes tries that expired more than a day ago; returns how many. */
export async function purgeExpiredLevelTries(q: Queryable, now = new Date()): Promise<number> {
  return q("level_tries").where("expires_at", "<", new Date(now.getTime() - 24 * 3600_000)).delete();
}
