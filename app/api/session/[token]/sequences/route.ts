import { NextResponse } from "next/server";
import { z } from "zod";
import { parseParams, readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { admitUpload, uploadLinkLimit } from "@/lib/auth/rate-limit";
import { AppError, tooManyRequests } from "@/lib/errors";
import { ingestSequenceBatch } from "@/lib/data/recording";
import { forgetUploadSession, requireUploadSession } from "@/lib/data/uploadSessions";
import { sequenceBatchSchema } from "@/lib/runner";

export const dynamic = "force-dynamic";
const params = z.object({ token: z.string() });

/**
 * One sequence upload (movements + compressed stream). Idempotent by the batch key: a repeat
 * answers 200 {duplicate: true}. 422 malformed or implausible, 410 withdrawn, 429 past the link's
 * upload limit (counted before the body is read; the runner retries later). Token-authenticated.
 */
export const POST = route(async (request: Request, context: { params: Promise<{ token: string }> }) => {
  const { token } = parseParams(params, await context.params);
  const ctx = await requireUploadSession(db, token);
  const wait = await admitUpload(db, ctx.participant.id);
  if (wait !== null) {
    const e = tooManyRequests(`At most ${uploadLinkLimit().max} uploads a minute per session; the rest are sent later.`);
    return NextResponse.json({ error: { code: e.code, message: e.message } }, { status: 429, headers: { "retry-after": String(wait) } });
  }
  const batch = await readJson(request, sequenceBatchSchema);
  try {
    const result = await ingestSequenceBatch(db, ctx, batch);
    // no-transform: the answer is a few bytes, and compressing it cost more server time than anything else in the profile
    return NextResponse.json(result, { status: result.duplicate ? 200 : 201, headers: { "cache-control": "no-store, no-transform" } });
  } catch (e) {
    if (e instanceof AppError && (e.status === 409 || e.status === 410)) forgetUploadSession(token);
    throw e;
  }
});
