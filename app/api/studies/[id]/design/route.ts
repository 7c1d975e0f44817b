import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { saveDesign } from "@/lib/study/service/design";

type Ctx = { params: Promise<{ id: string }> };

/** Saves the design (editor or owner); invalid designs answer 422 with the issues' field paths. */
export const PUT = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id);
  const body = await readJson(request, z.unknown());
  return Response.json(await saveDesign(db, user, id, body));
});
