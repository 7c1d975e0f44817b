import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy, assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { invitationsCsv } from "@/lib/recruitment/invitationsCsv";
import { createInvitations, listParticipants } from "@/lib/recruitment/service";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { invitationSchema } from "@/lib/study/schemas";

type Ctx = { params: Promise<{ id: string }> };

/** The participants by code and status (team; reviewers once beyond draft). */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  await assertCanViewStudy(db, await getCurrentUser(), id);
  return Response.json({ participants: await listParticipants(db, id) });
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
