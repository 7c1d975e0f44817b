import { afterAll, describe, expect, it } from "vitest";
import { consumePasswordToken, issuePasswordToken, TOKEN_LIFETIME_MS } from "@/lib/accounts/password-tokens";
import { verifyPassword } from "@/lib/auth/password";
import { hashToken } from "@/lib/auth/tokens";
import { isSignInLimited, recordSignInAttempt, SIGN_IN_LIMIT } from "@/lib/auth/rate-limit";
import { db } from "@/lib/db";
import { insertUser } from "@/lib/data/users";

afterAll(async () => {
  await db.destroy();
});

describe("password tokens", () => {
  it("store only the hash, work once, and expire after one hour", async () => {
    const id = await insertUser(db, { email: "token.test@lab.example", name: "Token Test", role: "researcher", passwordHash: null });
    const token = await issuePasswordToken(db, id, "reset");
    const stored = await db("password_tokens").where({ user_id: id }).first();
    expect(stored.token_hash).toBe(hashToken(token));
    expect(JSON.stringify(stored)).not.toContain(token);
    expect(stored.expires_at.getTime() - stored.created_at.getTime()).toBeGreaterThan(TOKEN_LIFETIME_MS - 5_000);

    expect(await consumePasswordToken(db, token, "a-new-password-1")).toBe(id);
    const user = await db("users").where({ id }).first();
    expect(await verifyPassword("a-new-password-1", user.password_hash)).toBe(true);
    expect(await consumePasswordToken(db, token, "another-password-2")).toBeNull();

    const late = await issuePasswordToken(db, id, "reset", new Date(Date.now() - TOKEN_LIFETIME_MS - 1000));
    expect(await consumePasswordToken(db, late, "another-password-2")).toBeNull();
    expect(await consumePasswordToken(db, "not-a-token-at-all-xxxxxxxx", "another-password-2")).toBeNull();
  });
});

describe("sign-in rate limit", () => {
  it(`limits after ${SIGN_IN_LIMIT.failures} failures per account and address within the window`, async () => {
    const email = "limited@lab.example";
    for (let i = 0; i < SIGN_IN_LIMIT.failures - 1; i++) await recordSignInAttempt(db, email, "10.0.0.9", false);
    expect(await isSignInLimited(db, email, "10.0.0.9")).toBe(false);
    await recordSignInAttempt(db, email, "10.0.0.9", false);
    expect(await isSignInLimited(db, email, "10.0.0.9")).toBe(true);
    expect(await isSignInLimited(db, email, "10.0.0.10")).toBe(false);
    expect(await isSignInLimited(db, "other@lab.example", "10.0.0.9")).toBe(false);
    expect(await isSignInLimited(db, email, "10.0.0.9", new Date(Date.now() + (SIGN_IN_LIMIT.windowMinutes + 1) * 60_000))).toBe(false);
  });
});
