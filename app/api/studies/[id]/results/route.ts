import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { EXCLUSION_RULES } from "@/lib/analysis";
import { db } from "@/lib/db";
import { studyPathMeasures } from "@/lib/data/pathMeasures";
import { assertStudyTeam, fetchResultsParticipants, fetchStudyDesign, fetchStudyTrialRecords } from "@/lib/data/results";
import { buildResultsView } from "@/lib/results";
import { fetchResearcherExclusions } from "@/lib/data/exclusions";
import { getCurrentUser } from "@/lib/session";
import { FLAG_COLUMNS } from "@/lib/trials";

type Ctx = { params: Promise<{ id: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive() });
/** ?exclude=misfire|mt3sd|misfire+mt3sd|none&drop=timed_out,recentered,clutched */
const querySchema = z.object({
  exclude: z.enum(EXCLUSION_RULES).default("misfire"),
  drop: z
    .string()
    .default("")
    .transform((s) => s.split(",").filter(Boolean))
    .pipe(z.array(z.enum(FLAG_COLUMNS))),
});

/** GET: the study's results (progress, analysis, plot data) under the chosen exclusion rule. Study team only. */
export const GET = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  const search = new URL(request.url).searchParams;
  const query = parseParams(querySchema, { exclude: search.get("exclude") ?? undefined, drop: search.get("drop") ?? undefined });
  const { study } = await assertStudyTeam(db, await getCurrentUser(), id);
  const design = await fetchStudyDesign(db, id);
  const participants = await fetchResultsParticipants(db, id);
  let view = null;
  if (design) {
    const records = await fetchStudyTrialRecords(db, id);
    const paths = await studyPathMeasures(db, design, participants, records);
    view = buildResultsView(design, participants, records, { exclude: query.exclude, dropFlagged: query.drop, researcherExclusions: await fetchResearcherExclusions(db, id) }, paths);
  }
  return Response.json(
    { study: { id: study.id, title: study.title, status: study.status }, hasDesign: design !== null, results: view, computedAt: new Date().toISOString() },
    { headers: { "cache-control": "no-store" } },
  );
});
