import type { Knex } from "knex";
import { AppError, conflict, notFound } from "@/lib/errors";

/** A participant's status as stored (participants.status). */
export type ParticipantStatus = "invited" | "consented" | "in_progress" | "completed" | "withdrawn";

/** Statuses in which a session still takes data: consent is given and the session has not ended. */
export const ACTIVE_STATUSES: readonly ParticipantStatus[] = ["consented", "in_progress"];

/** The withdrawn status answers uploads with 410 Gone: the session accepts no more data. */
export const withdrawnError = () => new AppError(410, "withdrawn", "This session was withdrawn; no more data is accepted.");

/** Why a write is refused for a participant in `status` (a status outside ACTIVE_STATUSES). */
export function refusalFor(status: string | undefined): AppError {
  if (status === undefined) return notFound("No session for this link.");
  if (status === "withdrawn") return withdrawnError();
  if (status === "completed") return conflict("This session is complete.");
  if (status === "invited") return conflict("Consent comes first.");
  return conflict(`This session cannot take data now (${status}).`);
}

/**
 * The guard of every participant write (lockActiveParticipant): one UPDATE that takes the
 * participant row's lock, checks the status and marks the activity (plus `set`), so a write racing
 * a withdrawal or an erasure either commits before it (and is then erased with the rest) or finds
 * the session ended — never inserts after it. Call it first in the write's transaction; the lock
 * is held until that transaction ends. `set` may hold raw expressions that read the row's old
 * values (MariaDB evaluates SET left to right).
 * @throws AppError 410 (withdrawn), 409 (not consented, complete), 404 (no such participant).
 */
export async function lockActiveParticipant(trx: Knex.Transaction, participantId: number, set: Record<string, unknown> = {}, now = new Date()): Promise<void> {
  const n = await trx("participants").where({ id: participantId }).whereIn("status", ACTIVE_STATUSES).update({ ...set, last_activity_at: now });
  if (n === 1) return;
  const row = await trx("participants").where({ id: participantId }).first<{ status: string } | undefined>("status");
  throw refusalFor(row?.status);
}
