import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { completeSession, requireSession } from "@/lib/data/participants";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/** Completes the session when every measured sequence is stored; answers the completion code. Token-authenticated. */
export const POST = route(async (_request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  return NextResponse.json({ completionCode: await completeSession(db, ctx) });
});
