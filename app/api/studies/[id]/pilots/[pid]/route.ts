import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { deletePilot, setPilotIncluded } from "@/lib/data/pilots";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string; pid: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive(), pid: z.coerce.number().int().positive() });

/** Includes a pilot or simulated participant in results and archives, or leaves it out: { included } (editor or owner). */
export const PATCH = route(async (request: Request, context: Ctx) => {
  const { id, pid } = parseParams(paramsSchema, await context.params);
  const { included } = await readJson(request, z.strictObject({ included: z.boolean() }));
  await setPilotIncluded(db, await getCurrentUser(), id, pid, included);
  return Response.json({ ok: true, included });
});

/** Deletes a pilot or simulated participant and all it recorded (editor or owner; never a real participant). */
export const DELETE = route(async (_request: Request, context: Ctx) => {
  const { id, pid } = parseParams(paramsSchema, await context.params);
  await deletePilot(db, await getCurrentUser(), id, pid);
  return Response.json({ ok: true });
});
