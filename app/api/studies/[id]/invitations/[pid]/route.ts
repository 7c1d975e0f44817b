import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { manageInvitation } from "@/lib/recruitment/service";
import { getCurrentUser } from "@/lib/session";
import { invitationActionSchema } from "@/lib/study/schemas";

type Ctx = { params: Promise<{ id: string; pid: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive(), pid: z.coerce.number().int().positive() });

/** { action: resend | remind | revoke } on one invitation (editor or owner; logged by code). */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id, pid } = parseParams(paramsSchema, await context.params);
  const input = await readJson(request, invitationActionSchema);
  return Response.json({ invitation: await manageInvitation(db, await getCurrentUser(), id, pid, input) });
});
