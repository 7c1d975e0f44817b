import { describe, expect, it } from "vitest";
import { z } from "zod";
import { JSON_BODY_LIMIT, readForm, readJson } from "@/lib/api/body";
import { toErrorResponse } from "@/lib/api/respond";
import { AREA_ROLES, rolesForPath } from "@/lib/auth/roles";
import { clientAddress } from "@/lib/auth/rate-limit";
import { hashToken, newToken } from "@/lib/auth/tokens";
import { parseEnv } from "@/lib/env";
import { AppError, forbidden } from "@/lib/errors";

const schema = z.object({ n: z.number().int() });
const post = (body: string, type = "application/json") => new Request("http://x/api", { method: "POST", body, headers: { "content-type": type } });

async function failure(p: Promise<unknown>): Promise<{ status: number; body: { error: { code: string; message: string } } }> {
  try {
    await p;
  } catch (e) {
    const res = toErrorResponse(e);
    return { status: res.status, body: (await res.json()) as { error: { code: string; message: string } } };
  }
  throw new Error("expected a failure");
}

describe("readForm", () => {
  const form = (body: string, type = "application/x-www-form-urlencoded", length?: number) =>
    new Request("http://x/", { method: "POST", body, headers: { "content-type": type, ...(length !== undefined ? { "content-length": String(length) } : {}) } });
  it("reads a urlencoded form (WHATWG URL: application/x-www-form-urlencoded, '+' is a space)", async () => {
    expect((await readForm(form("panel_id=AB+C%26D&x=1"))).get("panel_id")).toBe("AB C&D");
  });
  it("refuses another content type (415) and a body over the limit (413), streamed or declared", async () => {
    await expect(readForm(form("{}", "application/json"))).rejects.toMatchObject({ status: 415 });
    await expect(readForm(form("a=" + "x".repeat(5000)))).rejects.toMatchObject({ status: 413 });
    await expect(readForm(form("a=1", undefined, 10_000))).rejects.toMatchObject({ status: 413 });
  });
});

describe("readJson", () => {
  it("parses and validates a good body", async () => {
    expect(await readJson(post('{"n":3}'), schema)).toEqual({ n: 3 });
  });
  it("answers 400 for malformed JSON, 422 naming the field for wrong types, 415 for another type, 413 over the limit", async () => {
    expect((await failure(readJson(post("{n:"), schema))).status).toBe(400);
    const wrong = await failure(readJson(post('{"n":"three"}'), schema));
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.message).toMatch(/^n: /);
    expect((await failure(readJson(post('{"n":1}', "text/plain"), schema))).status).toBe(415);
    const big = `{"n":1,"pad":"${"x".repeat(JSON_BODY_LIMIT)}"}`;
    expect((await failure(readJson(post(big), schema))).status).toBe(413);
  });
});

describe("error mapping", () => {
  it("keeps an AppError's status and hides unknown errors behind a plain 500", async () => {
    expect(toErrorResponse(forbidden()).status).toBe(403);
    const res = toErrorResponse(new Error("secret detail"));
    expect(res.status).toBe(500);
    expect(JSON.stringify(await res.json())).not.toContain("secret detail");
    expect(new AppError(409, "conflict", "x")).toBeInstanceOf(Error);
  });
});

describe("role areas", () => {
  it("maps paths to the roles that may enter them, prefix-exact", () => {
    expect(rolesForPath("/admin")).toEqual(["admin"]);
    expect(rolesForPath("/admin/mail")).toEqual(["admin"]);
    expect(rolesForPath("/administrator")).toBeNull();
    expect(rolesForPath("/studies/3")).toEqual(["researcher"]);
    expect(rolesForPath("/review/audit")).toEqual(["reviewer"]);
    expect(rolesForPath("/signin")).toBeNull();
    expect(new Set(AREA_ROLES.map((a) => a.prefix)).size).toBe(AREA_ROLES.length);
  });
  it("does not take the client address from X-Forwarded-For unless proxies are trusted (tests/unit/client-address.test.ts)", () => {
    expect(clientAddress(new Headers({ "x-forwarded-for": "203.0.113.5, 10.0.0.1" }), 0)).toBe("unknown");
    expect(clientAddress({}, 0)).toBe("unknown");
  });
});

describe("tokens", () => {
  it("are 256-bit URL-safe and only their SHA-256 is kept", () => {
    const { token, hash } = newToken();
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(hash).toBe(hashToken(token));
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
    expect(newToken().token).not.toBe(token);
  });
});

describe("environment", () => {
  it("needs NEXTAUTH_SECRET in production and names it when missing", () => {
    expect(() => parseEnv({ NODE_ENV: "production" })).toThrow(/NEXTAUTH_SECRET is required outside development/);
    expect(() => parseEnv({ NODE_ENV: "production", NEXTAUTH_SECRET: "0123456789abcdef0123", PARTICIPANT_DATA_KEY: "0123456789abcdef0123" })).toThrow(/AUDIT_KEY is required outside development/);
    expect(parseEnv({ NODE_ENV: "production", NEXTAUTH_SECRET: "0123456789abcdef0123", PARTICIPANT_DATA_KEY: "0123456789abcdef0123", AUDIT_KEY: "0123456789abcdef0123" }).NODE_ENV).toBe("production");
    expect(parseEnv({ NODE_ENV: "development" }).NEXTAUTH_SECRET.length).toBeGreaterThanOrEqual(16);
    expect(() => parseEnv({ NODE_ENV: "development", DB_PORT: "not-a-port" })).toThrow(/DB_PORT/);
    expect(parseEnv({ DB_PORT: "3310" }).DB_PORT).toBe(3310);
  });
});
