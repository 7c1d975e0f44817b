import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { requireUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchExportJob } from "@/lib/data/exports";
import { assertStudyTeam } from "@/lib/data/results";
import { notFound } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ exportId: string }> };
const paramsSchema = z.object({ exportId: z.coerce.number().int().positive() });

/** GET: one export job's state (for the progress bar). Team of the export's study only. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { exportId } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getCurrentUser());
  const job = await fetchExportJob(db, exportId);
  if (!job) throw notFound("No such export.");
  await assertStudyTeam(db, user, job.studyId);
  return Response.json({ export: job }, { headers: { "cache-control": "no-store" } });
});
