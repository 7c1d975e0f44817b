import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { completeSession, requireSession, returnAddressesFor } from "@/lib/data/participants";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/** Completes the session when every measured sequence is stored; answers the completion code. Token-authenticated. */
export const POST = route(async (_request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  const completionCode = await completeSession(db, ctx);
  const returnTo = await returnAddressesFor(db, { ...ctx, participant: { ...ctx.participant, status: "completed", completion_code: completionCode } });
  return NextResponse.json({ completionCode, returnUrl: returnTo.complete });
});
