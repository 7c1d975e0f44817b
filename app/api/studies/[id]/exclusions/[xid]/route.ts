import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { revokeExclusion } from "@/lib/data/exclusions";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string; xid: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive(), xid: z.coerce.number().int().positive() });

/** Takes an exclusion back (editor or owner); the record stays, marked as taken back. */
export const DELETE = route(async (_request: Request, context: Ctx) => {
  const { id, xid } = parseParams(paramsSchema, await context.params);
  await revokeExclusion(db, await getCurrentUser(), id, xid);
  return Response.json({ ok: true });
});
