import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy, assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { invitationsCsv } from "@/lib/recruitment/invitationsCsv";
import { createInvitations, listInvitations, listParticipants } from "@/lib/recruitment/service";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { invitationSchema } from "@/lib/study/schemas";

type Ctx = { params: Promise<{ id: string }> };

/**
 * The participants by code and status (team; reviewers once beyond draft); for the team also the
 * invitations with their mailing history, and for the owner alone which address got which code.
 */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const { teamRole } = await assertCanViewStudy(db, await getCurrentUser(), id);
  const participants = await listParticipants(db, id);
  return Response.json(teamRole ? { participants, invitations: await listInvitations(db, id, teamRole === "owner") } : { participants });
});

/**
 * { mode: "links", count } answers a CSV (participant, link, completion_code) to download;
 * { mode: "email", emails } sends one invitation each and answers the codes (editor or owner).
 */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id);
  const input = await readJson(request, invitationSchema);
  const made = await createInvitations(db, user, id, input);
  if (input.mode === "links") {
    return new Response(invitationsCsv(made), {
      status: 201,
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="study-${id}-links.csv"`, "cache-control": "no-store" },
    });
  }
  return Response.json({ invited: made.map((m) => ({ code: m.code })) }, { status: 201 });
});
