import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { listProtocolVersions, pendingAmendment } from "@/lib/study/service/protocol";

type Ctx = { params: Promise<{ id: string }> };

/** The protocol versions (newest first) and what the working copy changes since the version in force (team; reviewers once beyond draft). */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  await assertCanViewStudy(db, await getCurrentUser(), id);
  const [versions, pending] = await Promise.all([listProtocolVersions(db, id), pendingAmendment(db, id)]);
  return Response.json({
    versions: versions.map(({ design: _design, consentBody: _consent, ...v }) => v),
    inForce: pending.inForce ? pending.inForce.version : null,
    changes: pending.changes,
  });
});
