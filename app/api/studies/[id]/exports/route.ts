import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { insertExportJob, listExportJobs } from "@/lib/data/exports";
import { startExportProcess } from "@/lib/data/exportProcess";
import { assertStudyTeam, fetchStudyDesign } from "@/lib/data/results";
import { conflict } from "@/lib/errors";
import { exportOptionsSchema } from "@/lib/export";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive() });

/** GET: the study's export jobs, newest first (progress, SHA-256, size). Study team only. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  await assertStudyTeam(db, await getCurrentUser(), id);
  return Response.json({ exports: await listExportJobs(db, id) }, { headers: { "cache-control": "no-store" } });
});

/** POST: start an anonymised archive with the given options; answers 202 with the job at once. Study team only. */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  const user = await getCurrentUser();
  await assertStudyTeam(db, user, id);
  const options = await readJson(request, exportOptionsSchema);
  if (!(await fetchStudyDesign(db, id))) throw conflict("The study has no design yet, so there is nothing to export.");
  const jobId = await insertExportJob(db, { studyId: id, options, createdBy: user!.id });
  await appendAudit(db, { actorUserId: user!.id, actorLabel: user!.email, action: "export.start", studyId: id, details: { exportId: jobId, options } });
  void startExportProcess(db, jobId, { id: user!.id, label: user!.email }); // its own process; progress goes to the database
  return Response.json({ export: { id: jobId, status: "queued" } }, { status: 202 });
});
