import NextAuth from "next-auth";
import { z } from "zod";
import { authOptions } from "@/lib/auth/options";
import { clientAddress, isSignInLimited, SIGN_IN_LIMIT } from "@/lib/auth/rate-limit";
import { db } from "@/lib/db";
import { env } from "@/lib/env";

const handler = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

/** Answers 429 before next-auth sees a sign-in for an account + address over its failure limit. */
async function post(request: Request, context: Ctx): Promise<Response> {
  const { nextauth } = await context.params;
  if (nextauth.join("/") === "callback/credentials") {
    const form = await request.clone().formData().catch(() => null);
    const email = z.string().max(254).safeParse(form?.get("email"));
    if (email.success && (await isSignInLimited(db, email.data, clientAddress(request.headers)))) {
      const message = `Too many failed sign-ins. Try again in ${SIGN_IN_LIMIT.windowMinutes} minutes, or reset your password.`;
      return Response.json(
        { error: { code: "rate_limited", message }, url: `${env.NEXTAUTH_URL}/signin?error=RateLimited` },
        { status: 429, headers: { "retry-after": String(SIGN_IN_LIMIT.windowMinutes * 60) } },
      );
    }
  }
  return handler(request, context);
}

export { handler as GET, post as POST };
