import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy, assertCanViewStudy } from "@/lib/auth/guards";
import { consentChecklist } from "@/lib/consent/consentChecklist";
import { consentBodySchema } from "@/lib/consent/schema";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { listConsentVersions, saveConsentDraft } from "@/lib/study/service/consent";

type Ctx = { params: Promise<{ id: string }> };

/** Every consent version, newest first, with the checklist of the newest. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  await assertCanViewStudy(db, await getCurrentUser(), id);
  const versions = await listConsentVersions(db, id);
  return Response.json({ versions, checklist: versions[0] ? consentChecklist(versions[0].body) : [] });
});

/** Saves the text into the open draft version, or starts a new version (editor or owner). */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id);
  const input = await readJson(request, consentBodySchema);
  const version = await saveConsentDraft(db, user, id, input);
  return Response.json({ version, checklist: consentChecklist(version.body) });
});
