import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanViewStudy, assertOwnsStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { teamMemberSchema } from "@/lib/study/schemas";
import { listTeam, setTeamMember } from "@/lib/study/service/meta";

type Ctx = { params: Promise<{ id: string }> };

export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  await assertCanViewStudy(db, await getCurrentUser(), id);
  return Response.json({ team: await listTeam(db, id) });
});

/** Adds a researcher as editor or viewer, or changes their role (owner only). */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertOwnsStudy(db, user, id);
  const input = await readJson(request, teamMemberSchema);
  return Response.json({ team: await setTeamMember(db, user, id, input) });
});
