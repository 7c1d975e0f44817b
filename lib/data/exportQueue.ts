import type { Knex } from "knex";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
import type { Queryable } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { DAY_MS, deleteExportFiles, removePartialFiles } from "@/lib/data/exportFiles";
import { insertExportJob } from "@/lib/data/exports";
export { HEARTBEAT_MS } from "@/lib/data/exports";
import { fetchStudyDesign } from "@/lib/data/results";
import { env } from "@/lib/env";
import { conflict } from "@/lib/errors";
import type { ExportOptions } from "@/lib/export";

/** Export jobs of one study that may wait or run at once; a further request is refused (409). */
export const MAX_UNFINISHED_PER_STUDY = 3;
/** A running job silent this long (ms; its process beats every HEARTBEAT_MS) has lost its process (its server was killed with it): it is failed. EXPORT_STALE_SECONDS, default 120 s. */
export const STALE_AFTER_MS = env.EXPORT_STALE_SECONDS * 1000;

const QUEUE_LOCK = "yawpoint.export-queue";

/** Who started a job, for the audit entries its process writes. */
export type ExportActor = { id: number; label: string };
/** Runs one claimed job to its end (startExportProcess in the server; tests pass their own). */
export type JobRunner = (db: Knex, jobId: number, actor: ExportActor) => Promise<void>;

/**
 * Asks for an export of a study (requestExport): editors and owners only (viewers see results,
 * but an archive is a copy of the study's data leaving the server, and each costs a process).
 * Under the study's row lock, at most MAX_UNFINISHED_PER_STUDY jobs of the study may be waiting
 * or running; the job is queued with its audit entry in the same transaction.
 * @throws 401/403/404 from the guard; 409 without a design or past the study's limit.
 * @returns the new job's id (status "queued"; dispatchExports starts it when its turn comes).
 */
export async function requestExport(db: Knex, user: SessionUser | null, studyId: number, options: ExportOptions): Promise<number> {
  await assertCanEditStudy(db, user, studyId);
  const u = user!;
  if (!(await fetchStudyDesign(db, studyId))) throw conflict("The study has no design yet, so there is nothing to export.");
  return db.transaction(async (trx) => {
    await trx("studies").where({ id: studyId }).forUpdate().first("id");
    const [{ n }] = (await trx("exports").where({ study_id: studyId }).whereIn("status", ["queued", "running"]).count({ n: "*" })) as [{ n: number | string }];
    if (Number(n) >= MAX_UNFINISHED_PER_STUDY) {
      throw conflict(`This study already has ${n} exports waiting or running; start another when one of them has finished.`);
    }
    const jobId = await insertExportJob(trx, { studyId, options, createdBy: u.id });
    await appendAudit(trx, { actorUserId: u.id, actorLabel: u.email, action: "export.start", studyId, details: { exportId: jobId, options } });
    return jobId;
  });
}

type Claimed = { id: number; studyId: number; actor: ExportActor };

/** Fails running jobs whose process stopped beating (failStaleJobs); returns them. Under the queue lock. */
async function failStaleJobs(trx: Knex.Transaction, now: Date): Promise<{ id: number; study_id: number }[]> {
  const stale = await trx("exports").where({ status: "running" }).andWhere((w) => w.whereNull("heartbeat_at").orWhere("heartbeat_at", "<", new Date(now.getTime() - STALE_AFTER_MS)))
    .select<{ id: number; study_id: number }[]>("id", "study_id");
  for (const job of stale) {
    await trx("exports").where({ id: job.id, status: "running" })
      .update({ status: "failed", stage: "failed", error: "the export process stopped without finishing (no sign of life for two minutes); start a new export", finished_at: now });
    await appendAudit(trx, { actorUserId: null, actorLabel: "server", action: "export.fail", studyId: job.study_id, details: { exportId: job.id, reason: "no heartbeat" } });
  }
  return stale;
}

/**
 * Claims the jobs whose turn has come (claimExports), under a server-wide lock (GET_LOCK, so
 * every server process sees one queue): first, running jobs whose process has been silent for
 * STALE_AFTER_MS are failed; then the oldest waiting jobs are marked running, at most one per
 * study and at most `capacity` running in all.
 * Cost: O(unfinished jobs). @throws database errors.
 */
export async function claimExports(db: Knex, capacity = env.EXPORT_CONCURRENCY, now = new Date()): Promise<Claimed[]> {
  let stale: { id: number; study_id: number }[] = [];
  const claimed = await db.transaction(async (trx) => {
    const [[lock]] = (await trx.raw("SELECT GET_LOCK(?, 10) AS got", [QUEUE_LOCK])) as [[{ got: number | null }]];
    if (Number(lock?.got) !== 1) return [] as Claimed[];
    try {
      stale = await failStaleJobs(trx, now);
      // a locking read: GET_LOCK is released before this transaction commits, so a plain read could
      // see the snapshot from before another dispatcher's claims were committed (and start a second
      // job of one study); FOR UPDATE waits for those rows and reads what was committed
      const running = await trx("exports").where({ status: "running" }).forUpdate().pluck("study_id") as number[];
      const busy = new Set(running);
      let free = capacity - running.length;
      const waiting = await trx("exports as e").join("users as u", "u.id", "e.created_by").where("e.status", "queued").orderBy("e.id")
        .select<{ id: number; study_id: number; created_by: number; email: string }[]>("e.id", "e.study_id", "e.created_by", "u.email");
      const picked: Claimed[] = [];
      for (const w of waiting) {
        if (free <= 0) break;
        if (busy.has(w.study_id)) continue;
        const n = await trx("exports").where({ id: w.id, status: "queued" }).update({ status: "running", stage: "starting", started_at: now, heartbeat_at: now });
        if (n !== 1) continue;
        busy.add(w.study_id);
        free--;
        picked.push({ id: w.id, studyId: w.study_id, actor: { id: w.created_by, label: w.email } });
      }
      return picked;
    } finally {
      await trx.raw("SELECT RELEASE_LOCK(?)", [QUEUE_LOCK]);
    }
  });
  for (const job of stale) await removePartialFiles(job.study_id, job.id);
  return claimed;
}

/**
 * Starts every job whose turn has come (dispatchExports) and, as each ends, looks again, so
 * the queue drains by itself. Called after a request, and by the server's housekeeping (which
 * also notices jobs that lost their process). Never throws (a failure is logged; the next call
 * tries again).
 * @returns the ids started now.
 */
export async function dispatchExports(db: Knex, run: JobRunner, capacity = env.EXPORT_CONCURRENCY): Promise<number[]> {
  let claimed: Claimed[];
  try {
    claimed = await claimExports(db, capacity);
  } catch (e) {
    console.error("export queue: could not claim jobs", e);
    return [];
  }
  for (const job of claimed) {
    void run(db, job.id, job.actor).finally(() => void dispatchExports(db, run, capacity));
  }
  return claimed.map((c) => c.id);
}

/**
 * Deletes the files of archives past their retention period (sweepExpiredExports): done jobs
 * finished more than EXPORT_RETENTION_DAYS ago whose file is still there. The job stays listed,
 * with the day its file was deleted. Downloads past the period are refused even before a sweep
 * (fetchExportFile). Also retries files an erasure could not delete.
 * @returns how many files were deleted.
 */
export async function sweepExpiredExports(q: Queryable, now = new Date(), days = env.EXPORT_RETENTION_DAYS): Promise<number> {
  const cutoff = new Date(now.getTime() - days * DAY_MS);
  const ids = await q("exports").whereNotNull("path").andWhere((w) => w.where((x) => x.where("status", "done").andWhere("finished_at", "<", cutoff)).orWhereNotNull("superseded_at")).pluck("id") as number[];
  return deleteExportFiles(q, ids, now);
}
