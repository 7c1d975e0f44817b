import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { updateStudySchema } from "@/lib/study/schemas";
import { fetchDesign } from "@/lib/study/service/design";
import { listTeam, updateStudyMeta } from "@/lib/study/service/meta";

type Ctx = { params: Promise<{ id: string }> };

/** The study, its design and its team (team members; reviewers once it is beyond draft). */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const { study, teamRole } = await assertCanViewStudy(db, await getCurrentUser(), id);
  const { design, designHash } = await fetchDesign(db, id);
  return Response.json({ study, teamRole, design, designHash, team: await listTeam(db, id) });
});

/** Title, summary, protocol number (editor or owner). */
export const PATCH = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanViewStudy(db, user, id);
  const input = await readJson(request, updateStudySchema);
  return Response.json({ study: await updateStudyMeta(db, user, id, input) });
});
