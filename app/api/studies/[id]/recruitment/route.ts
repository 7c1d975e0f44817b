import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanViewStudy, assertOwnsStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { changeRecruitment, recruitmentBlocker, recruitmentState } from "@/lib/recruitment/service";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { recruitmentSchema } from "@/lib/study/schemas";

type Ctx = { params: Promise<{ id: string }> };

/** Status, public link and cap, and what (if anything) blocks opening (team). */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  const { teamRole } = await assertCanViewStudy(db, user, id);
  const state = await recruitmentState(db, id);
  return Response.json({ ...state, publicLink: teamRole ? state.publicLink : null, blocker: await recruitmentBlocker(db, id) });
});

/** { action: open | close | settings, participantCap?, publicLink? } (owner). */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertOwnsStudy(db, user, id);
  const input = await readJson(request, recruitmentSchema);
  return Response.json(await changeRecruitment(db, user, id, input));
});
