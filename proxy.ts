import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { ROLE_HOME, rolesForPath } from "@/lib/auth/roles";
import { contentSecurityPolicy, servesOverTls, STRICT_TRANSPORT_SECURITY } from "@/lib/server/securityHeaders";

/**
 * Runs before every page (not the API): gives each request a fresh CSP nonce (Next.js applies it to
 * its own scripts; the root layout renders every page per request), adds HSTS when the public
 * address is https, and keeps people out of role areas they may not use. The last is the first
 * line of defence only: every route handler and server action checks the role again on the
 * server (lib/auth/guards.ts).
 */
export default async function proxy(req: NextRequest): Promise<NextResponse> {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy(nonce, process.env.NODE_ENV === "development");
  const res = (await areaRedirect(req)) ?? NextResponse.next({ request: { headers: withNonce(req.headers, nonce, csp) } });
  res.headers.set("content-security-policy", csp);
  if (servesOverTls(process.env.NEXTAUTH_URL)) res.headers.set("strict-transport-security", STRICT_TRANSPORT_SECURITY);
  return res;
}

/** A redirect away from a role area the visitor may not use (to sign in, or to their own area), or null. */
async function areaRedirect(req: NextRequest): Promise<NextResponse | null> {
  const allowed = rolesForPath(req.nextUrl.pathname);
  if (!allowed) return null;
  const role = (await getToken({ req, secret: process.env.NEXTAUTH_SECRET }))?.role;
  if (role && allowed.includes(role)) return null;
  if (role) return NextResponse.redirect(new URL(ROLE_HOME[role], req.url));
  const signin = new URL("/signin", req.url);
  signin.searchParams.set("callbackUrl", req.nextUrl.pathname + req.nextUrl.search);
  return NextResponse.redirect(signin);
}

/** The request headers Next.js reads the nonce from when it renders the page. */
function withNonce(incoming: Headers, nonce: string, csp: string): Headers {
  const headers = new Headers(incoming);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", csp);
  return headers;
}

// Pages only: not the build's static files, and not the API (a proxy makes Next buffer request
// bodies, which uploads must not be; API answers get their own strict policy in next.config.ts).
export const config = { matcher: ["/((?!api/|_next/static|_next/image|favicon.ico).*)"] };
