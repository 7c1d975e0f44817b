import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { listExportJobs } from "@/lib/data/exports";
import { startExportProcess } from "@/lib/data/exportProcess";
import { dispatchExports, requestExport } from "@/lib/data/exportQueue";
import { assertStudyTeam } from "@/lib/data/results";
import { exportOptionsSchema } from "@/lib/export";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive() });

/** GET: the study's export jobs, newest first (progress, SHA-256, size, when the file is deleted). Study team only. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  await assertStudyTeam(db, await getCurrentUser(), id);
  return Response.json({ exports: await listExportJobs(db, id) }, { headers: { "cache-control": "no-store" } });
});

/**
 * POST: queue an anonymised archive with the given options; answers 202 with the job at once.
 * Editors and owners of the study only; 409 while the study has too many jobs waiting or running.
 * The job starts when the server-wide queue reaches it (one running job per study).
 */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id); // before the body is read
  const options = await readJson(request, exportOptionsSchema);
  const jobId = await requestExport(db, user, id, options);
  await dispatchExports(db, startExportProcess); // each job in its own process; progress goes to the database
  return Response.json({ export: { id: jobId, status: "queued" } }, { status: 202 });
});
