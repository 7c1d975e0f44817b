import NextAuth from "next-auth";
import { z } from "zod";
import { authOptions } from "@/lib/auth/options";
import { clientAddress, SIGN_IN_ACCOUNT_LIMIT } from "@/lib/auth/rate-limit";
import { admitSignIn } from "@/lib/auth/signInLimits";
import { db } from "@/lib/db";
import { env } from "@/lib/env";

const handler = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

/**
 * Counts every sign-in attempt against its account and its address before next-auth checks the
 * password, and answers 429 once either limit is used up (admitSignIn).
 */
async function post(request: Request, context: Ctx): Promise<Response> {
  const { nextauth } = await context.params;
  if (nextauth.join("/") === "callback/credentials") {
    const form = await request.clone().formData().catch(() => null);
    const email = z.string().max(254).safeParse(form?.get("email"));
    const limited = email.success ? await admitSignIn(db, email.data, clientAddress(request.headers)) : null;
    if (limited) {
      const minutes = limited.windowMs / 60_000;
      const message = limited === SIGN_IN_ACCOUNT_LIMIT
        ? `Too many failed sign-ins. Try again in ${minutes} minutes, or reset your password.`
        : `Too many failed sign-ins from this network. Try again in ${minutes} minutes.`;
      return Response.json(
        { error: { code: "rate_limited", message }, url: `${env.NEXTAUTH_URL}/signin?error=RateLimited` },
        { status: 429, headers: { "retry-after": String(minutes * 60) } },
      );
    }
  }
  return handler(request, context);
}

export { handler as GET, post as POST };
