import { readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { fetchStudiesForMember, fetchStudy, insertStudy } from "@/lib/data/studies";
import { createStudySchema } from "@/lib/schemas/studies";
import { getCurrentUser } from "@/lib/session";

export const GET = route(async () => {
  const user = requireRole(await getCurrentUser(), "researcher");
  return Response.json({ studies: await fetchStudiesForMember(db, user.id) });
});

export const POST = route(async (request: Request) => {
  const user = requireRole(await getCurrentUser(), "researcher");
  const input = await readJson(request, createStudySchema);
  const id = await db.transaction(async (trx) => {
    const id = await insertStudy(trx, { ...input, ownerId: user.id });
    await appendAudit(trx, { actorUserId: user.id, actorLabel: user.email, action: "study.create", studyId: id, details: { title: input.title } });
    return id;
  });
  return Response.json({ study: await fetchStudy(db, id) }, { status: 201 });
});
