import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertOwnsStudy, requireUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { fetchConsentRegister } from "@/lib/data/exports";
import { fetchStudy } from "@/lib/data/studies";
import { forbidden, notFound } from "@/lib/errors";
import { consentRegisterCsv } from "@/lib/consent/consentRegisterCsv";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive() });

/**
 * GET: the identified consent register (CSV): one row per consent record. Ethics reviewers and
 * the study's owner only (editors, viewers and admins get 403); every download is audit-logged.
 * Separate from the open archive, which never holds consent records.
 */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getCurrentUser());
  if (user.role === "reviewer") {
    if (!(await fetchStudy(db, id))) throw notFound("No such study.");
  } else if (user.role === "researcher") {
    await assertOwnsStudy(db, user, id);
  } else throw forbidden("Only ethics reviewers and the study's owner may read the consent register.");
  const records = await fetchConsentRegister(db, id);
  await appendAudit(db, { actorUserId: user.id, actorLabel: user.email, action: "consent_register.download", studyId: id, details: { records: records.length } });
  return new Response(consentRegisterCsv(records), {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="study-${id}-consent-register.csv"`, "cache-control": "no-store" },
  });
});
