import type { Knex } from "knex";
import { appendAudit } from "@/lib/data/audit";
import { deleteExportFiles } from "@/lib/data/exportFiles";
import { notFound } from "@/lib/errors";

/**
 * Erasure of a participant: every row that belongs to them goes, or keeps only what an audit needs
 * without identifying them. The lists below are the one place that says so.
 *
 * HOW A NEW TABLE OR COLUMN JOINS THE ERASURE. A table with a `participant_id` column is added to
 * PARTICIPANT_TABLES (delete its rows, or strip them: then its columns go into a map like
 * CONSENT_RECORD_COLUMNS); a new column of `participants` is added to PARTICIPANT_COLUMNS as
 * "keep" (never identifying), "clear" (set to null) or "day" (cut to the day). The integration
 * test tests/integration/erasure.test.ts reads the database's own catalogue and fails for a table
 * or column that is not listed, so nothing new can escape an erasure unnoticed.
 */

/** What erasure does with a table's rows of the participant. */
export type EraseAction = "delete" | "strip";

/** Every table that holds rows of a participant (by participant_id), and what erasure does with them. */
export const PARTICIPANT_TABLES: readonly { table: string; onErase: EraseAction; holds: string }[] = [
  { table: "trials", onErase: "delete", holds: "movements" },
  { table: "sequence_streams", onErase: "delete", holds: "raw sensor streams and their quality figures" },
  { table: "calibrations", onErase: "delete", holds: "device check and calibration results" },
  { table: "path_measures", onErase: "delete", holds: "path accuracy computed from the raw streams" },
  { table: "questionnaire_answers", onErase: "delete", holds: "answers, free text included" },
  { table: "participant_contacts", onErase: "delete", holds: "the encrypted e-mail address" },
  { table: "outgoing_mail", onErase: "delete", holds: "the log of mail sent to the participant (no addresses)" },
  { table: "export_participants", onErase: "delete", holds: "which archives held the participant (those archives are superseded first)" },
  { table: "exclusions", onErase: "delete", holds: "the team's exclusions of the participant's data, with their reasons" },
  {
    table: "consent_records",
    onErase: "strip",
    holds:
      "the consent record; it stays without the typed name, the device summary and the time of day, so the ethics board's register still shows that consent to that version was given and the person later erased",
  },
];

/** A column's fate on erasure: kept as it is, cleared (null), or cut to the day. */
export type ColumnFate = "keep" | "clear" | "day" | "set";

/**
 * The participants row stays as a tombstone (status withdrawn, erased_at set), so counts, the
 * counterbalancing and the audit log's entries keep their meaning; nothing in it identifies the
 * person or describes their session once the cleared columns are gone.
 * - keep: the pseudonymous code (what the owner erases by and the audit log names), the link's token
 *   hash (so the link answers "withdrawn" instead of "unknown"), the study, the source of the link
 *   and the counterbalancing row (the design's, not the person's);
 * - set: status, withdrawn_at, erased_at.
 */
export const PARTICIPANT_COLUMNS: Readonly<Record<string, ColumnFate>> = {
  id: "keep", study_id: "keep", code: "keep", token_hash: "keep", source: "keep", cb_row: "keep",
  status: "set", withdrawn_at: "set", erased_at: "set",
  created_at: "day",
  condition_order: "clear", between_levels: "clear", completion_code: "clear", progress: "clear", device: "clear",
  consented_at: "clear", started_at: "clear", completed_at: "clear", last_activity_at: "clear", withdrawal_reason: "clear",
  // lifecycle: kind, inclusion, protocol version and place describe the study's bookkeeping, not the person;
  // a pilot's design copy, the place's release, a revocation and the panel id (and its keyed hash) go
  kind: "keep", included: "keep", protocol_version_id: "keep", cb_slot: "keep",
  pilot_design: "clear", cb_released_at: "clear", cb_release_reason: "clear", revoked_at: "clear", panel_id_encrypted: "clear", panel_id_hmac: "clear",
};

/** The consent record's columns on erasure (see PARTICIPANT_TABLES). */
export const CONSENT_RECORD_COLUMNS: Readonly<Record<string, ColumnFate>> = {
  id: "keep", participant_id: "keep", consent_version_id: "keep", version_hash: "keep", agreed: "keep",
  signed_at: "day", withdrawn_at: "set", erased_at: "set",
  typed_name_encrypted: "clear", device_summary: "clear",
};

/** Who asked for the erasure: a signed-in user (the owner), or the participant through their link. */
export type ErasureActor = { userId: number | null; label: string };

export type ErasureReport = {
  participantId: number;
  code: string;
  studyId: number;
  alreadyErased: boolean;
  /** Rows removed per table. */
  removed: Record<string, number>;
  /** Export jobs whose archives held the participant: superseded, their files deleted. */
  supersededExports: number[];
};

const dayOf = (column: string) => `DATE(\`${column}\`)`;

/** The UPDATE of a stripped row: cleared columns to null, "day" columns cut to midnight. */
function stripUpdate(trx: Knex.Transaction, columns: Readonly<Record<string, ColumnFate>>, set: Record<string, unknown>): Record<string, unknown> {
  const update: Record<string, unknown> = {};
  for (const [column, fate] of Object.entries(columns)) {
    if (fate === "clear") update[column] = null;
    else if (fate === "day") update[column] = trx.raw(dayOf(column));
  }
  return { ...update, ...set };
}

/**
 * Erases a participant inside the caller's transaction (eraseParticipantWithin): locks the
 * participant row first (every participant write takes the same lock, lib/data/participantLock.ts,
 * so none can insert after this), supersedes the archives that held them, deletes or strips their
 * rows as PARTICIPANT_TABLES says, leaves the participants row as a tombstone, and audit-logs the
 * erasure in the same transaction with counts only (never a reason the participant gave).
 * The archive files are deleted by the caller after the commit (deleteExportFiles).
 * @throws AppError 404 when there is no such participant.
 */
export async function eraseParticipantWithin(trx: Knex.Transaction, participantId: number, actor: ErasureActor, now = new Date()): Promise<ErasureReport> {
  const row = await trx("participants").where({ id: participantId }).forUpdate()
    .first<{ id: number; study_id: number; code: string; erased_at: Date | null } | undefined>("id", "study_id", "code", "erased_at");
  if (!row) throw notFound("No such participant.");
  const report: ErasureReport = { participantId, code: row.code, studyId: row.study_id, alreadyErased: row.erased_at !== null, removed: {}, supersededExports: [] };
  if (report.alreadyErased) return report;

  report.supersededExports = (await trx("export_participants").where({ participant_id: participantId }).pluck("export_id")).map(Number);
  if (report.supersededExports.length > 0) {
    await trx("exports").whereIn("id", report.supersededExports).whereNull("superseded_at")
      .update({ superseded_at: now, superseded_reason: "a participant in it was erased" });
  }
  const consent = await trx("consent_records as r").join("consent_versions as v", "v.id", "r.consent_version_id")
    .where("r.participant_id", participantId).first<{ version: number } | undefined>("v.version");
  for (const t of PARTICIPANT_TABLES) {
    if (t.onErase === "delete") report.removed[t.table] = await trx(t.table).where({ participant_id: participantId }).delete();
  }
  await trx("consent_records").where({ participant_id: participantId })
    .update(stripUpdate(trx, CONSENT_RECORD_COLUMNS, { withdrawn_at: trx.raw("COALESCE(withdrawn_at, ?)", [now]), erased_at: now }));
  await trx("participants").where({ id: participantId })
    .update(stripUpdate(trx, PARTICIPANT_COLUMNS, { status: "withdrawn", withdrawn_at: trx.raw("COALESCE(withdrawn_at, ?)", [now]), erased_at: now }));
  await appendAudit(trx, {
    actorUserId: actor.userId, actorLabel: actor.label, action: "participant.erased", studyId: row.study_id,
    details: { participant: row.code, consentVersion: consent?.version ?? null, removed: report.removed, supersededExports: report.supersededExports },
  });
  return report;
}

/**
 * Erases a participant (eraseParticipant): every row that belongs to them, in one transaction
 * (eraseParticipantWithin), then the files of the archives that held them. Idempotent: a second
 * call finds the tombstone and answers alreadyErased. The lifecycle's "erase by code" and the
 * withdrawal with erasure both come here.
 * @throws AppError 404 when there is no such participant.
 * @example await eraseParticipant(db, 42, { actor: { userId: 3, label: "tomas@…" } }) // { removed: { trials: 104, … }, supersededExports: [7], … }
 */
export async function eraseParticipant(db: Knex, participantId: number, options: { actor: ErasureActor }): Promise<ErasureReport> {
  const report = await db.transaction((trx) => eraseParticipantWithin(trx, participantId, options.actor));
  await deleteExportFiles(db, report.supersededExports);
  return report;
}
