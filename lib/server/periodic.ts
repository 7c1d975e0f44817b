import { db } from "@/lib/db";
import { publishAuditHead } from "@/lib/data/auditHeads";
import { startExportProcess } from "@/lib/data/exportProcess";
import { dispatchExports, sweepExpiredExports } from "@/lib/data/exportQueue";

/** How often the server's housekeeping runs (each job is idempotent, and cheap when it has nothing to do). */
export const PERIODIC_INTERVAL_MS = 60 * 60 * 1000;

/** Housekeeping jobs, each run in turn; a failing job is logged and the others still run. */
const JOBS: { name: string; run: () => Promise<unknown> }[] = [
  { name: "publish the audit head", run: () => publishAuditHead(db) },
  { name: "delete archives past their retention period", run: () => sweepExpiredExports(db) },
  { name: "start waiting exports (and fail those whose process died)", run: () => dispatchExports(db, startExportProcess) },
];

let started = false;

/**
 * Starts the server's housekeeping (startPeriodicJobs): once soon after start, then every hour,
 * in every server process; the jobs themselves make sure each thing happens once (the day's
 * audit head is keyed by its day). The timer never keeps a process alive.
 */
export function startPeriodicJobs(): void {
  if (started) return;
  started = true;
  const tick = async (): Promise<void> => {
    for (const job of JOBS) {
      try {
        await job.run();
      } catch (e) {
        console.error(`housekeeping: could not ${job.name}`, e);
      }
    }
  };
  setTimeout(() => void tick(), 5_000).unref();
  setInterval(() => void tick(), PERIODIC_INTERVAL_MS).unref();
}

/** Runs every housekeeping job once now (tests, and a server that wants it at once). */
export async function runPeriodicJobsOnce(): Promise<void> {
  for (const job of JOBS) await job.run();
}
