import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { fetchSessionState, requireSession } from "@/lib/data/participants";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/** The participant's own session state. Authenticated by the link token alone (no account). */
export const GET = route(async (_request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  return NextResponse.json(await fetchSessionState(db, ctx), { headers: { "Cache-Control": "no-store" } });
});
