import { randomBytes } from "node:crypto";
import { mkdir, unlink } from "node:fs/promises";
import { join } from "node:path";
import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { exportsRoot, retentionEnd, studyExportDir } from "@/lib/data/exportFiles";
import { listExclusions } from "@/lib/data/exclusions";
import { pathEntries } from "@/lib/data/pathMeasures";
import { fetchCalibrations, fetchStudyDesign, fetchStudyTrialRecords, TRIAL_RECORD_COLUMNS, whereInAnalysis, whereNotExcluded } from "@/lib/data/results";
import type { StoredPath } from "@/lib/export/analysisEntries";
import {
  exportOptionsSchema, randomPseudonyms, stablePseudonym, writeArchive,
  type ArchiveSource, type ExportAnswer, type ExportOptions, type ExportParticipant, type ExportStream,
} from "@/lib/export";
import { openWithDataKey } from "@/lib/recruitment/dataKey";
import type { ParticipantStatus, TrialRecord } from "@/lib/results";

export type ExportStatus = "queued" | "running" | "done" | "failed";

/** How often a running job's process says it is alive (ms; the queue fails a job silent for much longer). */
export const HEARTBEAT_MS = 10_000;

/** An export job as pages and the API see it (the file path stays on the server). */
export type ExportJob = {
  id: number;
  studyId: number;
  status: ExportStatus;
  progress: number;
  stage: string;
  options: ExportOptions;
  sha256: string | null;
  sizeBytes: number | null;
  kAnonymity: number | null;
  warnings: string[];
  error: string | null;
  createdBy: string;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  fileName: string | null;
  /** Set when a participant in the archive was erased: the file is deleted and downloads are refused. */
  supersededAt: string | null;
  supersededReason: string | null;
  /** Set when the file was deleted (superseded, or past the retention period). */
  fileDeletedAt: string | null;
  /** When a finished archive's file will be deleted (the retention period ends); null once gone or while unfinished. */
  deleteAfter: string | null;
};

type ExportRow = {
  id: number; study_id: number; status: ExportStatus; progress: number; stage: string; options: unknown; path: string | null;
  sha256: string | null; size_bytes: number | string | null; k_anonymity: number | null; warnings: unknown; error: string | null;
  created_by: number; created_at: Date; started_at: Date | null; finished_at: Date | null; creator_name?: string;
  superseded_at: Date | null; superseded_reason: string | null; file_deleted_at: Date | null;
};

const parseJson = (v: unknown): unknown => (typeof v === "string" ? JSON.parse(v) : v);
const iso = (d: Date | null): string | null => (d ? d.toISOString() : null);

function toExportJob(r: ExportRow): ExportJob {
  return {
    id: r.id, studyId: r.study_id, status: r.status, progress: Number(r.progress), stage: r.stage,
    options: exportOptionsSchema.parse(parseJson(r.options) ?? {}),
    sha256: r.sha256, sizeBytes: r.size_bytes === null ? null : Number(r.size_bytes), kAnonymity: r.k_anonymity,
    warnings: (parseJson(r.warnings) as string[] | null) ?? [], error: r.error, createdBy: r.creator_name ?? String(r.created_by),
    createdAt: r.created_at.toISOString(), startedAt: iso(r.started_at), finishedAt: iso(r.finished_at),
    fileName: r.path && !r.superseded_at ? `study-${r.study_id}-export-${r.id}.zip` : null,
    supersededAt: iso(r.superseded_at), supersededReason: r.superseded_reason, fileDeletedAt: iso(r.file_deleted_at),
    deleteAfter: r.status === "done" && r.path && !r.superseded_at && r.finished_at ? retentionEnd(r.finished_at).toISOString() : null,
  };
}

const jobQuery = (q: Queryable) => q("exports as e").join("users as u", "u.id", "e.created_by").select("e.*", "u.name as creator_name");

export async function insertExportJob(q: Queryable, job: { studyId: number; options: ExportOptions; createdBy: number }): Promise<number> {
  const [id] = await q("exports").insert({ study_id: job.studyId, options: JSON.stringify(job.options), created_by: job.createdBy, stage: "waiting" });
  return Number(id);
}

export async function fetchExportJob(q: Queryable, id: number): Promise<ExportJob | undefined> {
  const row = (await jobQuery(q).where("e.id", id).first()) as ExportRow | undefined;
  return row ? toExportJob(row) : undefined;
}

/**
 * The job's archive file on disk (absolute), or null while it is not done, once it is superseded
 * (a participant in it was erased) and once its file is deleted or its retention period is over
 * (even before the sweep has deleted it: fileDeleted then says so).
 */
export async function fetchExportFile(q: Queryable, id: number, now = new Date()): Promise<{ studyId: number; path: string | null; status: ExportStatus; superseded: boolean; fileDeleted: boolean } | undefined> {
  const row = await q("exports").where({ id }).first<{ study_id: number; path: string | null; status: ExportStatus; superseded_at: Date | null; file_deleted_at: Date | null; finished_at: Date | null } | undefined>("study_id", "path", "status", "superseded_at", "file_deleted_at", "finished_at");
  if (!row) return undefined;
  const expired = row.finished_at !== null && retentionEnd(row.finished_at).getTime() <= now.getTime();
  const offered = row.path !== null && row.status === "done" && row.superseded_at === null && !expired;
  return { studyId: row.study_id, status: row.status, superseded: row.superseded_at !== null, fileDeleted: row.file_deleted_at !== null || (expired && row.status === "done"), path: offered ? join(exportsRoot(), row.path!) : null };
}

export async function listExportJobs(q: Queryable, studyId: number): Promise<ExportJob[]> {
  const rows = (await jobQuery(q).where("e.study_id", studyId).orderBy("e.id", "desc").limit(50)) as ExportRow[];
  return rows.map(toExportJob);
}

/** The study's HMAC key for stable pseudonyms, created on first use. */
export async function pseudonymSecret(q: Queryable, studyId: number): Promise<string> {
  const row = await q("study_pseudonym_keys").where({ study_id: studyId }).first<{ secret_hex: string } | undefined>("secret_hex");
  if (row) return row.secret_hex;
  await q("study_pseudonym_keys").insert({ study_id: studyId, secret_hex: randomBytes(32).toString("hex") }).onConflict("study_id").ignore();
  const again = await q("study_pseudonym_keys").where({ study_id: studyId }).first<{ secret_hex: string }>("secret_hex");
  return again!.secret_hex;
}

/**
 * The archive source of a study, read from the database: participants who have consented and not
 * withdrawn; movements and streams paged by id, so nothing holds the whole study. Only the
 * columns the archive may carry are read (no codes, tokens, contacts, typed names or devices).
 */
export async function databaseArchiveSource(db: Knex, studyId: number): Promise<ArchiveSource> {
  const study = await db("studies").where({ id: studyId }).first<{ id: number; title: string; created_at: Date }>("id", "title", "created_at");
  const design = await fetchStudyDesign(db, studyId);
  if (!study || !design) throw new Error("databaseArchiveSource requires a study with a design");
  // real participants and the pilots the team included; never the invited, the withdrawn or other pilots
  const people = await whereInAnalysis(db("participants as p").where("p.study_id", studyId))
    .leftJoin("study_reviews as v", "v.id", "p.protocol_version_id")
    .whereNotIn("p.status", ["invited", "withdrawn"])
    .orderBy("p.id")
    .select<{ id: number; status: string; cb_row: number | null; condition_order: unknown; between_levels: unknown; started_at: Date | null; completed_at: Date | null; version: number | null }[]>(
      "p.id", "p.status", "p.cb_row", "p.condition_order", "p.between_levels", "p.started_at", "p.completed_at", "v.version as version",
    );
  // everyone who consented (the same scope), withdrawn ones included, for the methods text
  const history = (await whereInAnalysis(db("participants as p").where("p.study_id", studyId))
    .whereNot("p.status", "invited")
    .select(db.raw("COUNT(*) AS recruited"), db.raw("SUM(p.status = 'withdrawn') AS withdrawn"), db.raw("SUM(p.status = 'withdrawn' AND p.erased_at IS NOT NULL) AS erased"))
    .first()) as { recruited: number | string; withdrawn: number | string | null; erased: number | string | null };
  const recruitment = { recruited: Number(history.recruited), withdrawn: Number(history.withdrawn ?? 0), erased: Number(history.erased ?? 0) };
  const exclusions = (await listExclusions(db, studyId)).filter((e) => people.some((p) => p.id === e.participantId));
  const excludedPeople = new Set(exclusions.filter((e) => e.scope === "participant").map((e) => e.participantId));
  const ids = people.map((p) => p.id);
  const finals = ids.length
    ? await db("questionnaire_answers").whereIn("participant_id", ids).andWhere({ condition: "" }).select<{ participant_id: number; item_id: string; value_int: number | null; value_text: string | null }[]>("participant_id", "item_id", "value_int", "value_text")
    : [];
  const participants: ExportParticipant[] = people.map((p) => ({
    id: p.id, status: p.status, cbRow: p.cb_row,
    conditionOrder: (parseJson(p.condition_order) as string[] | null) ?? [],
    betweenLevels: (parseJson(p.between_levels) as Record<string, string> | null) ?? {},
    startedAt: p.started_at, completedAt: p.completed_at,
    final: Object.fromEntries(finals.filter((f) => f.participant_id === p.id).map((f) => [f.item_id, f.value_text ?? f.value_int])),
    protocolVersion: p.version, excluded: excludedPeople.has(p.id),
  }));
  const consentVersions = await db("consent_versions").where({ study_id: studyId }).whereIn("status", ["submitted", "approved"]).orderBy("version")
    .select<{ version: number; sha256: string | null; status: string; body_md: string }[]>("version", "sha256", "status", "body_md");
  const countOf = async (table: string, extra: Record<string, unknown> = {}) =>
    ids.length ? Number(((await db(table).whereIn("participant_id", ids).andWhere(extra).count({ n: "*" }).first()) as { n: number | string }).n) : 0;
  const page = 5000;
  return {
    study: { id: study.id, title: study.title, design, createdAt: study.created_at },
    consentVersions: consentVersions.map((v) => ({ version: v.version, sha256: v.sha256, status: v.status, bodyMd: v.body_md })),
    participants,
    recruitment,
    exclusions: exclusions.map((e) => ({ participantId: e.participantId, scope: e.scope, condition: e.condition, block: e.block, sequence: e.sequence, reason: e.reason, movements: e.movements })),
    counts: { trials: await countOf("trials", { practice: false }), streams: await countOf("sequence_streams") },
    async *trials(): AsyncIterable<TrialRecord> {
      // participant by participant in the order of `participants` (the writer's pseudonym order)
      for (const person of participants) {
        let last = 0;
        for (;;) {
          // the team's exclusions are honoured here: excluded participants' and sequences' movements never reach the archive
          const rows = (await whereNotExcluded(db("trials as t").where("t.participant_id", person.id).andWhere("t.practice", false).andWhere("t.id", ">", last)).orderBy("t.id").limit(page).select("t.id", ...TRIAL_RECORD_COLUMNS.map((c) => `t.${c}`))) as (TrialRecord & { id: number })[];
          for (const r of rows) yield r;
          if (rows.length < page) break;
          last = Number(rows.at(-1)!.id);
        }
      }
    },
    async *answers(): AsyncIterable<ExportAnswer> {
      if (ids.length === 0) return;
      const rows = await db("questionnaire_answers").whereIn("participant_id", ids).orderBy("id")
        .select<{ participant_id: number; condition: string; item_id: string; value_int: number | null; value_text: string | null; answered_at: Date }[]>("participant_id", "condition", "item_id", "value_int", "value_text", "answered_at");
      const rank = new Map(participants.map((p, i) => [p.id, i]));
      rows.sort((x, y) => rank.get(x.participant_id)! - rank.get(y.participant_id)!); // stable: each one's answers keep their order
      for (const a of rows) yield { participantId: a.participant_id, condition: a.condition, itemId: a.item_id, valueInt: a.value_int, valueText: a.value_text, answeredAt: a.answered_at };
    },
    async *streams(): AsyncIterable<ExportStream> {
      if (ids.length === 0) return;
      const metas = await whereNotExcluded(db("sequence_streams as t").whereIn("t.participant_id", ids)).orderBy("t.id")
        .select<{ id: number; participant_id: number; condition: string; condition_index: number; block: number; sequence: number; practice: number | boolean }[]>("t.id", "t.participant_id", "t.condition", "t.condition_index", "t.block", "t.sequence", "t.practice");
      const rank = new Map(participants.map((p, i) => [p.id, i]));
      metas.sort((x, y) => rank.get(x.participant_id)! - rank.get(y.participant_id)!);
      for (const m of metas) {
        yield {
          participantId: m.participant_id, condition: m.condition, conditionIndex: m.condition_index, block: m.block, sequence: m.sequence, practice: Boolean(m.practice),
          read: async () => (await db("sequence_streams").where({ id: m.id }).first<{ stream_gz: Buffer | null } | undefined>("stream_gz"))?.stream_gz ?? null,
        };
      }
    },
    calibrations: () => fetchCalibrations(db, ids),
    /** Path accuracy, one participant at a time (kept in path_measures; computed where missing). */
    async paths(): Promise<StoredPath[]> {
      const out: StoredPath[] = [];
      for (const p of participants) {
        const { entries } = await pathEntries(db, design, [{ id: p.id, code: String(p.id), status: p.status as ParticipantStatus }], await fetchStudyTrialRecords(db, studyId, p.id));
        out.push(...entries);
      }
      return out;
    },
  };
}

/**
 * Runs one export job to the end (runExportJob): writes the archive under EXPORTS_DIR, keeps the
 * job's progress in the database (at most every 300 ms), and records the result or the error.
 * Run by scripts/export-job.ts in its own process (startExportProcess); never throws.
 */
export async function runExportJob(db: Knex, jobId: number, actor: { id: number; label: string }): Promise<void> {
  const job = await fetchExportJob(db, jobId);
  if (!job) return;
  // a sign of life for the queue (lib/data/exportQueue.ts): a job that stops beating lost its process
  const beat = setInterval(() => void db("exports").where({ id: jobId, status: "running" }).update({ heartbeat_at: new Date() }).catch(() => {}), HEARTBEAT_MS);
  beat.unref();
  try {
    const started = await db("exports").where({ id: jobId }).whereIn("status", ["queued", "running"]).update({ status: "running", started_at: new Date(), heartbeat_at: new Date(), stage: "starting" });
    if (started !== 1) return; // given up before its process came up
    const source = await databaseArchiveSource(db, job.studyId);
    const ids = source.participants.map((p) => p.id);
    let pseudonyms: Map<number, string>;
    if (job.options.pseudonyms === "stable") {
      const secret = await pseudonymSecret(db, job.studyId);
      pseudonyms = new Map(ids.map((id) => [id, stablePseudonym(secret, id)]));
    } else pseudonyms = randomPseudonyms(ids);
    const relative = join(studyExportDir(job.studyId), `export-${jobId}-${randomBytes(6).toString("hex")}.zip`);
    const absolute = join(exportsRoot(), relative);
    await mkdir(join(exportsRoot(), studyExportDir(job.studyId)), { recursive: true });
    let lastWrite = 0;
    let pending: Promise<unknown> = Promise.resolve();
    const summary = await writeArchive(source, job.options, pseudonyms, absolute, (fraction, stage) => {
      const now = Date.now();
      if (now - lastWrite < 300 && fraction < 1) return;
      lastWrite = now;
      pending = pending.then(() => db("exports").where({ id: jobId }).update({ progress: Math.min(0.99, fraction), stage })).catch(() => {});
    });
    await pending;
    await db.transaction(async (trx) => {
      // The archive names its participants (for erasure) under their row locks: an erasure that
      // came while it was written fails the job here; one that comes later finds these rows.
      const still = ids.length ? await trx("participants").whereIn("id", ids).whereNull("erased_at").forShare().pluck("id") : [];
      if (still.length !== ids.length) throw new Error("a participant was erased while the archive was written; start a new export");
      for (let i = 0; i < ids.length; i += 1000) await trx("export_participants").insert(ids.slice(i, i + 1000).map((participant_id) => ({ export_id: jobId, participant_id })));
      const mine = await trx("exports").where({ id: jobId, status: "running" }).forUpdate().first("id");
      if (!mine) throw new Error("the job was given up while the archive was written (no sign of life in time); start a new export");
      await trx("exports").where({ id: jobId }).update({
        status: "done", progress: 1, stage: "done", path: relative, sha256: summary.sha256, size_bytes: summary.sizeBytes,
        k_anonymity: summary.kAnonymity.k, warnings: JSON.stringify(summary.warnings), finished_at: new Date(),
      });
      await appendAudit(trx, {
        actorUserId: actor.id, actorLabel: actor.label, action: "export.finish", studyId: job.studyId,
        details: { exportId: jobId, sha256: summary.sha256, sizeBytes: summary.sizeBytes, files: summary.files.length, kAnonymity: summary.kAnonymity.k, options: job.options },
      });
    }).catch(async (e: unknown) => {
      await unlink(absolute).catch(() => {});
      throw e;
    });
  } catch (err) {
    console.error(`export ${jobId} failed`, err);
    // the failure and its entry together (a job marked failed without its entry, or the reverse, never commits)
    await db.transaction(async (trx) => {
      const n = await trx("exports").where({ id: jobId }).whereIn("status", ["queued", "running"]).update({ status: "failed", stage: "failed", error: (err as Error).message.slice(0, 2000), finished_at: new Date() });
      if (n > 0) await appendAudit(trx, { actorUserId: actor.id, actorLabel: actor.label, action: "export.fail", studyId: job.studyId, details: { exportId: jobId } });
    }).catch(() => {});
  } finally {
    clearInterval(beat);
  }
}

/** One row of the identified consent register (typed name decrypted; see consentRegisterCsv). */
export type ConsentRegisterRecord = {
  participantCode: string; status: string; version: number; versionHash: string; documentHash: string | null;
  signedAt: Date; withdrawnAt: Date | null; erasedAt: Date | null; typedName: string | null; agreed: string[];
};

/**
 * The identified consent register of a study: one row per consent record, the typed name
 * decrypted (it is stored encrypted; a name that cannot be decrypted shows as such, never as the
 * stored text). Erased participants keep a row without name and with the day of signing only.
 */
export async function fetchConsentRegister(q: Queryable, studyId: number): Promise<ConsentRegisterRecord[]> {
  const rows = await q("consent_records as r")
    .join("participants as p", "p.id", "r.participant_id")
    .join("consent_versions as v", "v.id", "r.consent_version_id")
    .where("p.study_id", studyId)
    .orderBy("r.signed_at")
    .select<{ code: string; status: string; version: number; version_hash: string; sha256: string | null; signed_at: Date; withdrawn_at: Date | null; p_withdrawn: Date | null; erased_at: Date | null; typed_name_encrypted: string | null; agreed: unknown }[]>(
      "p.code", "p.status", "v.version", "r.version_hash", "v.sha256", "r.signed_at", "r.withdrawn_at", "p.withdrawn_at as p_withdrawn", "r.erased_at", "r.typed_name_encrypted", "r.agreed",
    );
  return rows.map((r) => ({
    participantCode: r.code, status: r.status, version: r.version, versionHash: r.version_hash, documentHash: r.sha256,
    signedAt: r.signed_at, withdrawnAt: r.withdrawn_at ?? r.p_withdrawn, erasedAt: r.erased_at, typedName: openTypedName(r.typed_name_encrypted), agreed: (parseJson(r.agreed) as string[] | null) ?? [],
  }));
}

function openTypedName(sealed: string | null): string | null {
  if (sealed === null) return null;
  try {
    return openWithDataKey(sealed);
  } catch {
    return "(cannot be decrypted with this server's key)";
  }
}
