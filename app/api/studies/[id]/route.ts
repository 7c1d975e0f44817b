import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const { study, teamRole } = await assertCanViewStudy(db, await getCurrentUser(), id);
  return Response.json({ study, teamRole });
});
