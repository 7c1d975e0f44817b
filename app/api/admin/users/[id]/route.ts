import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { changeUser } from "@/lib/accounts/users";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema, updateUserSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

export const PATCH = route(async (request: Request, context: Ctx) => {
  const actor = requireRole(await getCurrentUser(), "admin");
  const { id } = parseParams(idParamSchema, await context.params);
  const input = await readJson(request, updateUserSchema);
  return Response.json({ user: await changeUser(db, actor, id, input) });
});
