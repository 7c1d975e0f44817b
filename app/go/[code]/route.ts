import { db } from "@/lib/db";
import { resolveShortLink } from "@/lib/data/shortLinks";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ code: string }> };

const page = (status: number, heading: string, text: string) =>
  new Response(
    `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta name="robots" content="noindex"><title>Yawpoint</title>` +
      `<body style="font-family:sans-serif;max-width:40rem;margin:2rem auto;padding:0 1rem"><h1>${heading}</h1><p>${text}</p></body></html>`,
    { status, headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" } },
  );

/**
 * A short link (/go/<code>, lib/data/shortLinks.ts): redirects to the path it stands for while it
 * is valid. No account: the code is the credential, and it expires. Only paths on this server.
 */
export async function GET(_request: Request, context: Ctx): Promise<Response> {
  const found = await resolveShortLink(db, (await context.params).code);
  if (!found.ok) {
    return found.reason === "expired"
      ? page(410, "This link has expired", "Short links work for a limited time. Ask for a new one (or scan the new QR code).")
      : page(404, "Unknown link", "Check the code: it has 8 letters and digits.");
  }
  // the target was checked to be a path on this server when the link was made
  return new Response(null, { status: 303, headers: { location: found.target, "cache-control": "no-store", "referrer-policy": "no-referrer" } });
}
