import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { recordConsent, requireSession } from "@/lib/data/participants";
import { clientAddress } from "@/lib/auth/rate-limit";
import { sendConsentCopy } from "@/lib/mail/consentCopy";
import { env } from "@/lib/env";
import { consentRequestSchema } from "@/lib/runner";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/**
 * Records consent to the approved version (hash, server time, coarse device summary) and
 * assigns the condition order; sends a copy when the participant gives an address (the address
 * is not stored; one copy per participant, a few per client address: sendConsentCopy).
 * Token-authenticated.
 */
export const POST = route(async (request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  const body = await readJson(request, consentRequestSchema);
  const result = await recordConsent(db, ctx, body, request.headers.get("user-agent"));
  const copySent = body.email ? await sendConsentCopy(db, ctx, body.email, clientAddress(request.headers), result, `${env.NEXTAUTH_URL}/s/${token}`) : false;
  return NextResponse.json({ ok: true, signedAt: result.signedAt.toISOString(), order: result.order, copySent }, { status: 201 });
});
