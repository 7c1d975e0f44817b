import { withAuth } from "next-auth/middleware";
import { NextResponse } from "next/server";
import { ROLE_HOME, rolesForPath } from "@/lib/auth/roles";

/**
 * First line of defence only: keeps people out of role areas they may not use. Every route
 * handler and server action checks the role again on the server (lib/auth/guards.ts).
 */
export default withAuth(
  function proxy(req) {
    const role = req.nextauth.token?.role;
    const allowed = rolesForPath(req.nextUrl.pathname);
    if (allowed && (!role || !allowed.includes(role))) {
      return NextResponse.redirect(new URL(role ? ROLE_HOME[role] : "/signin", req.url));
    }
    return NextResponse.next();
  },
  { pages: { signIn: "/signin" } },
);

export const config = { matcher: ["/admin/:path*", "/studies/:path*", "/analyses/:path*", "/review/:path*"] };
