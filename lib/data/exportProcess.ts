import { spawn } from "node:child_process";
import type { Knex } from "knex";
import { appendAudit } from "@/lib/data/audit";
import { exportHeapLimitMb } from "@/lib/export";

/** The child's entry point, from the project directory the server runs in. */
const SCRIPT = "scripts/export-job.ts";

/**
 * Starts an export job in its own Node process (startExportProcess): `scripts/export-job.ts` under
 * tsx with `--max-old-space-size` from the study's movement count (exportHeapLimitMb). The web
 * process only waits for the exit; progress, result and errors go to the database as the job runs.
 * When the process ends without finishing the job (killed, out of memory), the job is marked failed.
 * `heapMb` overrides the cap (tests use a tiny one to see a crash handled).
 * Resolves when the child has exited; never throws.
 */
export async function startExportProcess(db: Knex, jobId: number, actor: { id: number; label: string }, heapMb?: number): Promise<void> {
  try {
    const job = await db("exports").where({ id: jobId }).first<{ study_id: number } | undefined>("study_id");
    if (!job) return;
    const [{ n }] = (await db("trials as t").join("participants as p", "p.id", "t.participant_id").where("p.study_id", job.study_id).count({ n: "*" })) as [{ n: number | string }];
    const cap = heapMb ?? exportHeapLimitMb(Number(n));
    const child = spawn(process.execPath, [`--max-old-space-size=${cap}`, "--import", "tsx", "--no-warnings", SCRIPT, String(jobId), String(actor.id), actor.label], {
      cwd: process.cwd(),
      env: process.env,
      stdio: ["ignore", "inherit", "inherit"],
    });
    const outcome = await new Promise<string | null>((done) => {
      child.once("error", (e) => done(`could not start the export process: ${e.message}`));
      child.once("exit", (code, signal) => done(code === 0 ? null : `the export process stopped (${signal ?? `exit code ${code}`})`));
    });
    if (outcome === null) return;
    await markFailed(db, jobId, outcome, actor);
  } catch (err) {
    await markFailed(db, jobId, (err as Error).message, actor);
  }
}

async function markFailed(db: Knex, jobId: number, message: string, actor: { id: number; label: string }): Promise<void> {
  try {
    await db.transaction(async (trx) => {
      const n = await trx("exports").where({ id: jobId }).whereIn("status", ["queued", "running"])
        .update({ status: "failed", stage: "failed", error: message.slice(0, 2000), finished_at: new Date() });
      if (n > 0) {
        console.error(`export ${jobId} failed: ${message}`);
        const row = await trx("exports").where({ id: jobId }).first<{ study_id: number }>("study_id");
        await appendAudit(trx, { actorUserId: actor.id, actorLabel: actor.label, action: "export.fail", studyId: row.study_id, details: { exportId: jobId, reason: message.slice(0, 200) } });
      }
    });
  } catch {
    // the database is gone too; the job stays as it was and the list shows it unfinished
  }
}
