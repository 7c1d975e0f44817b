import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { startTasks } from "@/lib/data/places";
import { requireSession } from "@/lib/data/participants";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/**
 * The first task sequence is about to start: the participant takes the first free
 * counterbalancing place and its condition order (idempotent). Token-authenticated.
 */
export const POST = route(async (_request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  return NextResponse.json(await startTasks(db, ctx), { headers: { "cache-control": "no-store" } });
});
