import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { requireSession, withdrawParticipant } from "@/lib/data/participants";
import { withdrawRequestSchema } from "@/lib/runner";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/** Withdraws the participant: no more data; earlier data erased when the study says so. Token-authenticated. */
export const POST = route(async (request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  const body = await readJson(request, withdrawRequestSchema);
  return NextResponse.json(await withdrawParticipant(db, ctx, body.reason));
});
