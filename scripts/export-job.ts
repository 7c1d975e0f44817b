// One export job in its own process: started by the server (lib/data/exportProcess.ts) with a heap
// cap sized to the study, so a long archive neither blocks a web process nor grows its memory.
// Usage: tsx scripts/export-job.ts <job id> <actor user id> <actor label>
import { z } from "zod";
import { db } from "@/lib/db";
import { runExportJob } from "@/lib/data/exports";

const args = z.tuple([z.coerce.number().int().positive(), z.coerce.number().int().positive(), z.string().min(1)]).safeParse(process.argv.slice(2));
if (!args.success) {
  console.error("usage: tsx scripts/export-job.ts <job id> <actor user id> <actor label>");
  process.exit(2);
}
const [jobId, actorId, actorLabel] = args.data;
try {
  await runExportJob(db, jobId, { id: actorId, label: actorLabel }); // records its own failure in the job
} finally {
  await db.destroy();
}
