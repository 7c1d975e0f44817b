import { z } from "zod";
import { AppError } from "@/lib/errors";
import { db } from "@/lib/db";
import { visitPublicLink } from "@/lib/recruitment/service";

type Ctx = { params: Promise<{ token: string }> };

const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{16,64}$/);

/**
 * The public link of a recruiting study: each visit makes a participant of its own (source
 * "public") and redirects to that participant's session link. No account; not a role area.
 */
export async function GET(request: Request, context: Ctx): Promise<Response> {
  const parsed = tokenSchema.safeParse((await context.params).token);
  const page = (status: number, text: string) => new Response(`<!doctype html><html lang="en"><meta charset="utf-8"><title>Yawpoint</title><body style="font-family:sans-serif;max-width:40rem;margin:3rem auto"><h1>Study link</h1><p>${text}</p></body></html>`, { status, headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" } });
  if (!parsed.success) return page(404, "This link is not valid.");
  try {
    const p = await visitPublicLink(db, parsed.data);
    return new Response(null, { status: 303, headers: { location: new URL(`/s/${p.token}`, request.url).pathname, "cache-control": "no-store" } });
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 409)) return page(e.status, e.message.replace(/[<>&]/g, ""));
    throw e;
  }
}
