import { afterAll, describe, expect, it } from "vitest";
import { consumePasswordToken, issuePasswordToken, TOKEN_LIFETIME_MS } from "@/lib/accounts/password-tokens";
import { startPasswordReset } from "@/lib/accounts/users";
import { verifyPassword } from "@/lib/auth/password";
import { hashToken } from "@/lib/auth/tokens";
import { hitLimit, isLimited, RESET_ACCOUNT_LIMIT, SIGN_IN_ACCOUNT_LIMIT, SIGN_IN_ADDRESS_LIMIT } from "@/lib/auth/rate-limit";
import { admitSignIn, signInSucceeded } from "@/lib/auth/signInLimits";
import { db } from "@/lib/db";
import { findUserById, insertUser } from "@/lib/data/users";

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

describe("sign-in and reset limits", () => {
  it("count atomically: of 100 parallel hits exactly the limit's number are within", async () => {
    const limit = { name: "test parallel", max: 10, windowMs: 60_000 };
    const results = await Promise.all(Array.from({ length: 100 }, () => hitLimit(db, limit, "someone@lab.example")));
    expect(results.filter((r) => r.within)).toHaveLength(10);
    expect(results.map((r) => r.count).sort((a, b) => a - b)).toEqual(Array.from({ length: 100 }, (_, i) => i + 1));
  });

  it(`let ${SIGN_IN_ACCOUNT_LIMIT.max} parallel attempts on one account through, whatever address each claims; a success gives its attempt back`, async () => {
    const email = "limited@lab.example";
    const outcomes = await Promise.all(Array.from({ length: 30 }, (_, i) => admitSignIn(db, email, `198.51.100.${i}`)));
    expect(outcomes.filter((o) => o === null)).toHaveLength(SIGN_IN_ACCOUNT_LIMIT.max);
    expect(outcomes.filter((o) => o === SIGN_IN_ACCOUNT_LIMIT)).toHaveLength(30 - SIGN_IN_ACCOUNT_LIMIT.max);
    expect(await isLimited(db, SIGN_IN_ACCOUNT_LIMIT, email)).toBe(true);
    expect(await admitSignIn(db, "other@lab.example", "198.51.100.0")).toBeNull();
    // a success is no failure: after nine failures and a success, the tenth failure still gets through
    const person = "returns@lab.example";
    for (let i = 0; i < 9; i++) expect(await admitSignIn(db, person, "192.0.2.7")).toBeNull();
    expect(await admitSignIn(db, person, "192.0.2.7")).toBeNull();
    await signInSucceeded(db, person, "192.0.2.7");
    expect(await admitSignIn(db, person, "192.0.2.7")).toBeNull();
    expect(await admitSignIn(db, person, "192.0.2.7")).toBe(SIGN_IN_ACCOUNT_LIMIT);
    // the next window starts afresh
    expect((await hitLimit(db, SIGN_IN_ACCOUNT_LIMIT, email, Date.now() + SIGN_IN_ACCOUNT_LIMIT.windowMs)).within).toBe(true);
    // the counters hold keyed hashes only, never the e-mail or the address
    expect(JSON.stringify(await db("rate_limits").select())).not.toMatch(/lab\.example|198\.51/);
  });

  it("limit one address over many accounts", async () => {
    const limit = { ...SIGN_IN_ADDRESS_LIMIT, max: 5 };
    for (let i = 0; i < 5; i++) expect((await hitLimit(db, limit, "203.0.113.1")).within).toBe(true);
    expect((await hitLimit(db, limit, "203.0.113.1")).within).toBe(false);
  });

  it("a new password ends the account's existing sessions (its session version rises)", async () => {
    const id = await insertUser(db, { email: "sessions.test@lab.example", name: "Session Test", role: "researcher", passwordHash: null });
    const before = (await findUserById(db, id))!.sessionVersion;
    await consumePasswordToken(db, await issuePasswordToken(db, id, "reset"), "a-new-password-1");
    expect((await findUserById(db, id))!.sessionVersion).toBe(before + 1);
  });

  it("answers a reset request without waiting for anything that depends on the account, at most three an hour per account", async () => {
    await insertUser(db, { email: "reset.exists@lab.example", name: "Reset Exists", role: "researcher", passwordHash: null });
    const started: string[] = [];
    const hangs = async (_db: unknown, email: string) => {
      started.push(email);
      await new Promise(() => {}); // a mail server that never answers
    };
    const t0 = Date.now();
    await startPasswordReset(db, "reset.exists@lab.example", "192.0.2.1", hangs);
    await startPasswordReset(db, "reset.unknown@lab.example", "192.0.2.1", hangs);
    expect(Date.now() - t0).toBeLessThan(5_000); // neither waited for the hung mail
    expect(started).toEqual(["reset.exists@lab.example", "reset.unknown@lab.example"]);
    for (let i = 0; i < 3; i++) await startPasswordReset(db, "reset.exists@lab.example", "192.0.2.2", hangs);
    expect(started.filter((e) => e === "reset.exists@lab.example")).toHaveLength(RESET_ACCOUNT_LIMIT.max);
  });
});
