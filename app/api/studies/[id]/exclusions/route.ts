import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { addExclusion, exclusionInputSchema, listExclusions } from "@/lib/data/exclusions";
import { assertStudyTeam } from "@/lib/data/results";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

/** Every exclusion of the study, taken-back ones too (study team). */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  await assertStudyTeam(db, await getCurrentUser(), id);
  return Response.json({ exclusions: await listExclusions(db, id, { all: true }) });
});

/** Excludes a participant or a sequence with a reason (editor or owner). */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const input = await readJson(request, exclusionInputSchema);
  return Response.json({ exclusion: await addExclusion(db, await getCurrentUser(), id, input) }, { status: 201 });
});
