import { afterAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { createShortLink, resolveShortLink } from "@/lib/data/shortLinks";

afterAll(() => db.destroy());

describe("short links", () => {
  it("lead to their target until they expire, and keep neither the code nor the target in clear", async () => {
    const now = new Date("2026-12-03T10:00:00Z");
    const link = await createShortLink(db, { purpose: "pilot", target: "/s/secret-session-token-abcdef", ttlMs: 3600_000 }, now);
    expect(link.url).toMatch(/\/go\/[2-9A-HJKMNP-Z]{8}$/);
    const row = await db("short_links").orderBy("id", "desc").first();
    expect(JSON.stringify(row)).not.toContain(link.code);
    expect(JSON.stringify(row)).not.toContain("secret-session-token");
    const typed = `${link.code.slice(0, 4).toLowerCase()}-${link.code.slice(4)}`;
    expect(await resolveShortLink(db, typed, new Date(now.getTime() + 59 * 60_000))).toEqual({ ok: true, target: "/s/secret-session-token-abcdef", purpose: "pilot" });
    expect(await resolveShortLink(db, link.code, new Date(now.getTime() + 3600_000))).toEqual({ ok: false, reason: "expired" });
    expect(await resolveShortLink(db, "ZZZZZZZZ", now)).toEqual({ ok: false, reason: "unknown" });
    expect((await db("short_links").where({ id: row.id }).first()).opened).toBe(1);
  });

  it("refuse a target on another site (a short link is no open redirect)", async () => {
    for (const target of ["https://elsewhere.example/", "//elsewhere.example/x", "/\\elsewhere.example"]) {
      await expect(createShortLink(db, { purpose: "try-level", target, ttlMs: 3600_000 })).rejects.toThrow();
    }
  });
});
