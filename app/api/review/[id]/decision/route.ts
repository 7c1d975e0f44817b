import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { decisionSchema } from "@/lib/study/schemas";
import { decideReview } from "@/lib/study/service/review";

type Ctx = { params: Promise<{ id: string }> };

/** A reviewer approves the submission of study [id], or returns it with a comment. */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = requireRole(await getCurrentUser(), "reviewer");
  const input = await readJson(request, decisionSchema);
  return Response.json({ review: await decideReview(db, user, id, input) });
});
