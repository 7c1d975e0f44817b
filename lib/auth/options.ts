import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { z } from "zod";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { findUserRowByEmail } from "@/lib/data/users";
import { env } from "@/lib/env";
import { verifyPassword } from "./password";
import { clientAddress } from "./rate-limit";
import { signInSucceeded } from "./signInLimits";
import { roleSchema } from "./roles";

const credentialsSchema = z.object({ email: z.string().trim().email().max(254), password: z.string().min(1).max(200) });

export const authOptions: NextAuthOptions = {
  secret: env.NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 8 * 60 * 60 },
  pages: { signIn: "/signin" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const parsed = credentialsSchema.safeParse(credentials);
        if (!parsed.success) return null;
        const { email, password } = parsed.data;
        // The route handler (app/api/auth/[...nextauth]/route.ts) has counted this attempt against
        // the account's and the address's limits before it reaches here (admitSignIn).
        const row = await findUserRowByEmail(db, email);
        const ok = await verifyPassword(password, row?.password_hash ?? null);
        if (!row || !ok || !row.active) return null;
        await signInSucceeded(db, email, clientAddress(req.headers ?? {}));
        await appendAudit(db, { actorUserId: row.id, actorLabel: row.email, action: "user.sign_in", details: {} });
        return { id: String(row.id), email: row.email, name: row.name, role: roleSchema.parse(row.role), sv: row.session_version };
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id);
        token.role = user.role;
        token.sv = user.sv;
      }
      return token;
    },
    session({ session, token }) {
      session.user = { id: token.uid, email: token.email ?? "", name: token.name ?? "", role: token.role, sv: token.sv ?? -1 };
      return session;
    },
  },
};
