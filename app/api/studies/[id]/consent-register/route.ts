import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertOwnsStudy, requireUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { fetchConsentRegister } from "@/lib/data/exports";
import { fetchStudy } from "@/lib/data/studies";
import { forbidden, notFound } from "@/lib/errors";
import { csvLine } from "@/lib/export";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive() });

const HEADER = ["participant_code", "status", "consent_version", "version_hash", "document_sha256", "signed_at", "withdrawn_at", "typed_name", "agreed"];

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
  const lines = [csvLine(HEADER), ...records.map((r) => csvLine([r.participantCode, r.status, r.version, r.versionHash, r.documentHash, r.signedAt.toISOString(), r.withdrawnAt ? r.withdrawnAt.toISOString() : null, r.typedName, r.agreed.join(" ")]))];
  return new Response(lines.join("\n") + "\n", {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="study-${id}-consent-register.csv"`, "cache-control": "no-store" },
  });
});
