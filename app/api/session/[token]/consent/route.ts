import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { recordConsent, requireSession } from "@/lib/data/participants";
import { sendMail } from "@/lib/mail/send";
import { env } from "@/lib/env";
import { consentCopyText, consentRequestSchema } from "@/lib/runner";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/**
 * Records consent to the approved version (hash, server time, coarse device summary) and
 * assigns the condition order; sends a copy when the participant gives an address (the address
 * is not stored). Token-authenticated.
 */
export const POST = route(async (request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireSession(db, token);
  const body = await readJson(request, consentRequestSchema);
  const result = await recordConsent(db, ctx, body, request.headers.get("user-agent"));
  let copySent = false;
  if (body.email) {
    const mail = consentCopyText({ participantCode: ctx.participant.code, studyTitle: ctx.study.title, version: result.version, hash: result.hash, signedAt: result.signedAt, body: result.body, withdrawLink: `${env.NEXTAUTH_URL}/s/${token}` });
    try {
      await sendMail({ to: body.email, subject: mail.subject, text: mail.text, template: "consent-copy", participantId: ctx.participant.id });
      copySent = true;
    } catch {
      copySent = false; // recorded as failed in outgoing_mail; consent stands
    }
  }
  return NextResponse.json({ ok: true, signedAt: result.signedAt.toISOString(), order: result.order, copySent }, { status: 201 });
});
