import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { cloneStudy } from "@/lib/study/service/clone";

type Ctx = { params: Promise<{ id: string }> };

/** Clones the study into a new draft owned by the caller (a researcher on its team). */
export const POST = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  return Response.json({ study: await cloneStudy(db, await getCurrentUser(), id) }, { status: 201 });
});
