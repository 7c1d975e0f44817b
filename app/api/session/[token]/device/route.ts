import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { requireSession, saveDeviceCheck } from "@/lib/data/participants";
import { deviceRequestSchema } from "@/lib/runner";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/** Stores the device check of the participant's own session. Authenticated by the link token alone (no account). */
export const POST = route(async (request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  const body = await readJson(request, deviceRequestSchema);
  await saveDeviceCheck(db, ctx, body);
  return NextResponse.json({ ok: true });
});
