import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { createLevelTry } from "@/lib/data/levelTries";
import { createShortLink, shortLinkView } from "@/lib/data/shortLinks";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { TRY_TTL_MS, trySetupSchema } from "@/lib/study/trySetup";

type Ctx = { params: Promise<{ id: string }> };

/**
 * POST: "try this level" (editor or owner): stores the condition's settings for an hour and
 * answers the /try/<token> path for this computer and a short link with its QR code for a phone.
 * Nothing a try does is recorded.
 */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id);
  const setup = await readJson(request, trySetupSchema);
  const { token, expiresAt } = await createLevelTry(db, id, user?.id ?? null, setup);
  const path = `/try/${token}`;
  const link = await createShortLink(db, { purpose: "try-level", target: path, ttlMs: TRY_TTL_MS, studyId: id, createdBy: user?.id ?? null });
  return Response.json({ path, expiresAt: expiresAt.toISOString(), link: await shortLinkView(link) }, { status: 201 });
});

export const dynamic = "force-dynamic";

