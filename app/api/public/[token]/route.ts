import { cookies } from "next/headers";
import { z } from "zod";
import { readForm } from "@/lib/api/body";
import { admitPublicStart, clientAddress } from "@/lib/auth/rate-limit";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { PANEL_ID_PATTERN, rememberedVisit, visitorCookieName } from "@/lib/recruitment/publicVisit";
import { returnAddress } from "@/lib/recruitment/returnAddress";
import { studyOfPublicLink, visitPublicLink } from "@/lib/recruitment/service";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ token: string }> };

const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{16,64}$/);
const FORM_LIMIT = 4096;

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
const page = (status: number, text: string, back?: string | null) =>
  new Response(
    `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta name="robots" content="noindex"><title>Yawpoint</title>` +
      `<body style="font-family:sans-serif;max-width:40rem;margin:2rem auto;padding:0 1rem"><h1>Study link</h1><p>${escape(text)}</p>` +
      (back ? `<p><a href="${escape(back)}">Return to the recruitment site</a></p>` : "") + `</body></html>`,
    { status, headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" } },
  );

/**
 * "Start" on a public link's information page (a form POST; a GET of the link only shows
 * information, so previews and scanners create nothing). One participant per browser: a visitor
 * cookie remembers the session, and a second start resumes it. A recruitment panel's participant
 * id comes in the form (taken from the query parameter the study names), kept encrypted.
 * Anonymous by design: the link itself is the invitation.
 */
export async function POST(request: Request, context: Ctx): Promise<Response> {
  const parsed = tokenSchema.safeParse((await context.params).token);
  if (!parsed.success) return page(404, "This link is not valid.");
  const study = await studyOfPublicLink(db, parsed.data);
  if (!study) return page(404, "This link is not valid.");
  const jar = await cookies();
  const resumed = await rememberedVisit(db, study.id, jar.get(visitorCookieName(study.id))?.value);
  if (resumed) return new Response(null, { status: 303, headers: { location: `/s/${resumed}`, "cache-control": "no-store" } });
  let form: URLSearchParams;
  try {
    form = await readForm(request, FORM_LIMIT);
  } catch (e) {
    return page(e instanceof AppError ? e.status : 400, "This request is not the study's Start form.");
  }
  // a resumed visit costs nothing; a new participant (and its audit entry) counts against the address
  const wait = await admitPublicStart(db, study.id, clientAddress(request.headers));
  if (wait !== null) {
    const res = page(429, `Too many starts from your network in a short time. Please try again in ${Math.ceil(wait / 60)} minute${wait > 60 ? "s" : ""}.`);
    res.headers.set("retry-after", String(wait));
    return res;
  }
  const raw = form.get("panel_id")?.trim() ?? "";
  const panelId = PANEL_ID_PATTERN.test(raw) ? raw : null;
  try {
    const p = await visitPublicLink(db, parsed.data, { panelId });
    jar.set(visitorCookieName(study.id), p.token, { httpOnly: true, sameSite: "lax", secure: request.url.startsWith("https:"), path: "/", maxAge: 30 * 24 * 3600 });
    return new Response(null, { status: 303, headers: { location: `/s/${p.token}`, "cache-control": "no-store" } });
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 409)) {
      const s = e.code === "full" ? await db("studies").where({ id: study.id }).first<{ return_url_screened: string | null }>("return_url_screened") : null;
      return page(e.status, e.message, s ? returnAddress(s.return_url_screened, { panelId }) : null);
    }
    throw e;
  }
}
