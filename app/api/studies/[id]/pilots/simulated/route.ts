import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { runSimulatedPilot, simulatedPilotSchema } from "@/lib/data/pilots";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

/** A simulated pilot: { participants, spread, include } (editor or owner); answers their codes and the minutes per session. */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const input = await readJson(request, simulatedPilotSchema);
  return Response.json({ simulated: await runSimulatedPilot(db, await getCurrentUser(), id, input) }, { status: 201 });
});
