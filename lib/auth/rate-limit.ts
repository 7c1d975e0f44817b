import type { Queryable } from "@/lib/db";

/** Failed sign-ins allowed per account and address within the window, before 429. */
export const SIGN_IN_LIMIT = { failures: 10, windowMinutes: 15 };

export async function recordSignInAttempt(q: Queryable, email: string, ip: string, succeeded: boolean): Promise<void> {
  await q("sign_in_attempts").insert({ email: email.trim().toLowerCase().slice(0, 254), ip: ip.slice(0, 64), succeeded });
}

/** True when the account + address pair has used up its failures in the window. */
export async function isSignInLimited(q: Queryable, email: string, ip: string, now = new Date()): Promise<boolean> {
  const since = new Date(now.getTime() - SIGN_IN_LIMIT.windowMinutes * 60_000);
  const row = await q("sign_in_attempts")
    .where({ email: email.trim().toLowerCase(), ip, succeeded: false })
    .andWhere("at", ">=", since)
    .count<{ n: number | string }[]>({ n: "*" })
    .first();
  return Number(row?.n ?? 0) >= SIGN_IN_LIMIT.failures;
}

/** The client's address as the server saw it (first hop of X-Forwarded-For when behind a proxy). */
export function clientAddress(headers: Headers | Record<string, string | string[] | undefined>): string {
  const get = (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name];
    return Array.isArray(v) ? v[0] : v;
  };
  return get("x-forwarded-for")?.split(",")[0]?.trim() || get("x-real-ip") || "local";
}
