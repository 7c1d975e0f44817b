import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { pilotRequestSchema, startPilot } from "@/lib/data/pilots";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

/**
 * Starts a pilot session (editor or owner, any status): { device: "here" | "phone" }. Answers the
 * session's path (to open here) and, for a phone, a short link with its QR code (an hour).
 */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const input = await readJson(request, pilotRequestSchema);
  return Response.json({ pilot: await startPilot(db, await getCurrentUser(), id, input) }, { status: 201, headers: { "cache-control": "no-store" } });
});
