import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { assertStudyTeam, fetchResultsParticipants, fetchStudyDesign, fetchStudyTrialRecords } from "@/lib/data/results";
import { buildResultsView } from "@/lib/results";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive() });

/** GET: the study's results (progress, analysis, plot data). Study team only. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  const { study } = await assertStudyTeam(db, await getCurrentUser(), id);
  const design = await fetchStudyDesign(db, id);
  const participants = await fetchResultsParticipants(db, id);
  const view = design ? buildResultsView(design, participants, await fetchStudyTrialRecords(db, id)) : null;
  return Response.json(
    { study: { id: study.id, title: study.title, status: study.status }, hasDesign: design !== null, results: view, computedAt: new Date().toISOString() },
    { headers: { "cache-control": "no-store" } },
  );
});
