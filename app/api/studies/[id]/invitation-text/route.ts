import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { invitationTextSchema } from "@/lib/study/schemas";
import { saveInvitationText } from "@/lib/study/service/meta";

type Ctx = { params: Promise<{ id: string }> };

/** Saves the working copy of the invitation e-mail's text (editor or owner); part of the protocol the reviewer approves. */
export const PUT = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const input = await readJson(request, invitationTextSchema);
  return Response.json(await saveInvitationText(db, await getCurrentUser(), id, input));
});
