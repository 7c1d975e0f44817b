import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { submitForReview } from "@/lib/study/service/review";

type Ctx = { params: Promise<{ id: string }> };

/** Submits the saved design and the newest consent version for ethics review (editor or owner). */
export const POST = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id);
  return Response.json({ review: await submitForReview(db, user, id) });
});
