import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { eraseByCode, erasureRequestSchema } from "@/lib/data/erasureRequests";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

/** Erases a participant on request by their code: { code, confirm: true } (the owner alone). Answers what was removed and the archives superseded. */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const input = await readJson(request, erasureRequestSchema);
  const report = await eraseByCode(db, await getCurrentUser(), id, input);
  return Response.json({ erasure: { code: report.code, alreadyErased: report.alreadyErased, removed: report.removed, supersededExports: report.supersededExports } });
});
