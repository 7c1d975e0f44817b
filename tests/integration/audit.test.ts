import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import { db } from "@/lib/db";
import { appendAudit, auditCanonical, auditHash, fetchAuditHead, GENESIS_HASH, VERIFY_PAGE, verifyAuditChain } from "@/lib/data/audit";
import { keptHeadLine, listPublishedHeads, parseKeptHeads, publishAuditHead } from "@/lib/data/auditHeads";
import { env } from "@/lib/env";
import { ownerDb } from "./ownerDb";

const owner = ownerDb();

beforeAll(async () => {
  await seedDemo(db);
});
afterAll(async () => {
  await owner.destroy();
  await db.destroy();
});

type Row = { id: number; at: Date; actor_user_id: number | null; actor_label: string; action: string; study_id: number | null; details: unknown; prev_hash: string; hash: string };
const details = (r: Row): unknown => (typeof r.details === "string" ? JSON.parse(r.details) : r.details);

async function resetLog(): Promise<void> {
  await owner("audit_log").delete();
  await owner("audit_head").where({ id: 1 }).update({ last_id: 0, hash: GENESIS_HASH, entries: 0 });
}

describe("audit chain", () => {
  it("is HMAC-SHA-256 over prev ‖ canonical JSON: RFC 4231 test cases 1 and 2, RFC 8785 canonical form", () => {
    // RFC 4231 §4.2 (test case 1): key = 20 × 0x0b, data "Hi There"
    expect(auditHash("\x0b".repeat(20), "Hi ", "There")).toBe("b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7");
    // RFC 4231 §4.3 (test case 2): key "Jefe", data "what do ya want for nothing?"
    expect(auditHash("Jefe", "what do ya want ", "for nothing?")).toBe("5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843");
    // RFC 8785: keys sorted, no white space
    expect(auditCanonical({ at: new Date(0), actorUserId: 1, actorLabel: "x", action: "a", studyId: null, details: { b: 2, a: 1 } })).toBe(
      '{"action":"a","actorLabel":"x","actorUserId":1,"at":"1970-01-01T00:00:00.000Z","details":{"a":1,"b":2},"studyId":null}',
    );
  });

  it("appends concurrently without forking, verifies intact, and names the first tampered entry", async () => {
    await resetLog();
    await Promise.all(Array.from({ length: 100 }, (_, i) => appendAudit(db, { actorUserId: null, actorLabel: "system", action: "test.append", details: { i } })));
    const rows = await owner<Row>("audit_log").orderBy("id");
    expect(rows[0]!.prev_hash).toBe(GENESIS_HASH);
    for (let i = 1; i < rows.length; i++) expect(rows[i]!.prev_hash).toBe(rows[i - 1]!.hash);
    expect(await fetchAuditHead(db)).toEqual({ lastId: rows.at(-1)!.id, hash: rows.at(-1)!.hash, entries: 100 });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: true, entries: 100 });

    const victim = rows[5]!;
    await owner("audit_log").where({ id: victim.id }).update({ details: JSON.stringify({ i: 999 }) });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: victim.id });
    await owner("audit_log").where({ id: victim.id }).update({ details: JSON.stringify(details(victim)) });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: true, entries: 100 });
    await owner("audit_log").where({ id: rows[28]!.id }).delete();
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: rows[29]!.id });
  });

  it("the application's database user cannot change or remove an entry, or the log itself (only the owner, who runs migrations, can)", async () => {
    await appendAudit(db, { actorUserId: null, actorLabel: "system", action: "test.append", details: {} });
    const denied = { code: expect.stringMatching(/ER_TABLEACCESS_DENIED_ERROR|ER_DBACCESS_DENIED_ERROR/) };
    await expect(db("audit_log").update({ actor_label: "someone else" })).rejects.toMatchObject(denied);
    await expect(db("audit_log").delete()).rejects.toMatchObject(denied);
    await expect(db.raw("TRUNCATE TABLE audit_log")).rejects.toMatchObject({ code: expect.stringMatching(/DENIED/) });
    await expect(db.raw("CREATE TRIGGER audit_unlock BEFORE UPDATE ON audit_log FOR EACH ROW SET @x = 1")).rejects.toMatchObject({ code: expect.stringMatching(/DENIED/) });
    await expect(db.raw("ALTER TABLE audit_log ADD COLUMN x INT")).rejects.toMatchObject({ code: expect.stringMatching(/DENIED/) });
    expect(await owner("audit_log").update({ actor_label: "system" })).toBeGreaterThan(0); // the owner can, which verification shows (below)
  });

  it("refuses a history rewritten by someone with database access but without the key (edited, then re-chained with SHA-256 as before)", async () => {
    await resetLog();
    for (let i = 0; i < 5; i++) await appendAudit(db, { actorUserId: 7, actorLabel: "tomas@harbourview-lab.example", action: "consent_register.download", studyId: 1, details: { i } });
    // The attack: blame someone else for entry 3 and recompute every hash after it the old way.
    const rows = await owner<Row>("audit_log").orderBy("id");
    let prev = GENESIS_HASH;
    for (const r of rows) {
      const label = r === rows[2] ? "priya@harbourview-lab.example" : r.actor_label;
      const hash = createHash("sha256").update(prev + auditCanonical({ at: r.at, actorUserId: r.actor_user_id, actorLabel: label, action: r.action, studyId: r.study_id, details: details(r) }), "utf8").digest("hex");
      await owner("audit_log").where({ id: r.id }).update({ actor_label: label, prev_hash: prev, hash });
      prev = hash;
    }
    await owner("audit_head").where({ id: 1 }).update({ hash: prev });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: rows[0]!.id, reason: "its content does not match its hash" });
    // The same rewrite under a guessed key fails as well; only AUDIT_KEY verifies.
    expect((await verifyAuditChain(db, { key: "a-guessed-key-of-some-length" })).intact).toBe(false);
    expect(env.AUDIT_KEY.length).toBeGreaterThanOrEqual(16);
  });

  it("shows entries removed from the end: by the head, and by a published head even when the head was moved back", async () => {
    await resetLog();
    for (let i = 0; i < 6; i++) await appendAudit(db, { actorUserId: null, actorLabel: "system", action: "test.append", details: { i } });
    const published = await fetchAuditHead(db); // e.g. the daily head a reviewer keeps
    const rows = await owner<Row>("audit_log").orderBy("id");
    await owner("audit_log").where({ id: rows[5]!.id }).delete();
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, reason: `the chain ends at entry ${rows[4]!.id}, but its head names entry ${rows[5]!.id}` });
    await owner("audit_head").where({ id: 1 }).update({ last_id: rows[4]!.id, hash: rows[4]!.hash, entries: 5 });
    expect((await verifyAuditChain(db)).intact).toBe(true); // consistent on its own ...
    expect(await verifyAuditChain(db, { kept: [published] })).toMatchObject({ intact: false, firstBrokenId: rows[5]!.id, reason: "an entry named by a published head is missing" });
  });

  it("commits an entry with its action or not at all", async () => {
    await resetLog();
    const title = `Atomic ${Date.now()}`;
    const ownerRow = await db("users").first<{ id: number }>("id");
    await expect(db.transaction(async (trx) => {
      await trx("studies").insert({ title, summary: "s", owner_id: ownerRow.id });
      await appendAudit(trx, { actorUserId: null, actorLabel: "system", action: "study.create", details: { title } });
      throw new Error("the action fails after its entry was written");
    })).rejects.toThrow("the action fails");
    expect(await db("studies").where({ title }).first()).toBeUndefined();
    expect(await owner("audit_log").count({ n: "*" })).toEqual([{ n: 0 }]);
    expect(await fetchAuditHead(db)).toEqual({ lastId: 0, hash: GENESIS_HASH, entries: 0 });
    // and an entry that cannot be written takes its action down with it
    await owner("audit_head").where({ id: 1 }).delete();
    await expect(db.transaction(async (trx) => {
      await trx("studies").insert({ title, summary: "s", owner_id: ownerRow.id });
      await appendAudit(trx, { actorUserId: null, actorLabel: "system", action: "study.create", details: { title } });
    })).rejects.toThrow(/audit head/);
    expect(await db("studies").where({ title }).first()).toBeUndefined();
    await owner("audit_head").insert({ id: 1, last_id: 0, hash: GENESIS_HASH, entries: 0 });
  });

  it("publishes the head once a day, mailed to every active reviewer, in the form verification takes back", async () => {
    await appendAudit(db, { actorUserId: null, actorLabel: "system", action: "test.append", details: {} });
    const day = new Date(Date.UTC(2031, 4, 6, 12));
    expect(await publishAuditHead(db, day)).toBe(true);
    expect(await publishAuditHead(db, new Date(day.getTime() + 3_600_000))).toBe(false); // the same day: once
    const head = await fetchAuditHead(db);
    expect((await listPublishedHeads(db)).find((p) => p.day === "2031-05-06")).toMatchObject({ lastId: head.lastId, hash: head.hash });
    const reviewers = await db("users").where({ role: "reviewer", active: true }).pluck("email");
    const mails = await db("outgoing_mail").where({ template: "audit-head" }).andWhere("created_at", ">=", new Date(Date.now() - 60_000)).pluck("to_address");
    for (const r of reviewers) expect(mails).toContain(r);
    expect(parseKeptHeads(`${keptHeadLine(head)}\n\n`)).toEqual([{ lastId: head.lastId, hash: head.hash }]);
    expect(() => parseKeptHeads("12:not-a-hash")).toThrow(/entry:hash/);
  });
});

describe("verification of a long chain", () => {
  it("reads 50 000 entries page by page (never more than a page in one answer), to the last entry", async () => {
    await resetLog();
    // 50 000 entries written straight into the table as appendAudit chains them (the chain's own
    // correctness is checked against RFC 4231 above; here only how verification reads it)
    const N = 50_000;
    const at = new Date(Date.UTC(2031, 0, 1));
    let prev = GENESIS_HASH;
    let lastHash = prev;
    for (let start = 0; start < N; start += 5000) {
      const rows = [];
      for (let i = start; i < Math.min(N, start + 5000); i++) {
        const content = { at: new Date(at.getTime() + i), actorUserId: null, actorLabel: "system", action: "test.bulk", studyId: null, details: { i } };
        const hash = auditHash(env.AUDIT_KEY, prev, auditCanonical(content));
        rows.push({ at: content.at, actor_user_id: null, actor_label: "system", action: "test.bulk", study_id: null, details: JSON.stringify({ i }), prev_hash: prev, hash });
        prev = hash;
      }
      await owner("audit_log").insert(rows);
      lastHash = prev;
    }
    const last = await owner("audit_log").max<{ id: number }[]>({ id: "id" });
    await owner("audit_head").where({ id: 1 }).update({ last_id: last[0]!.id, hash: lastHash, entries: N });

    // every answer the database gives verification, counted as it arrives
    const answers: number[] = [];
    const onResponse = (response: unknown, query: { sql?: string }) => {
      if (query.sql?.includes("`audit_log`") && Array.isArray(response)) answers.push(response.length);
    };
    db.on("query-response", onResponse);
    try {
      const started = performance.now();
      expect(await verifyAuditChain(db)).toMatchObject({ intact: true, entries: N });
      console.log(`verified ${N} entries in ${Math.round(performance.now() - started)} ms, ${answers.length} pages`);
    } finally {
      db.removeListener("query-response", onResponse);
    }
    expect(Math.max(...answers)).toBeLessThanOrEqual(VERIFY_PAGE);
    expect(answers.length).toBeGreaterThanOrEqual(Math.ceil(N / VERIFY_PAGE));
    expect(answers.reduce((a, b) => a + b, 0)).toBe(N);

    // and it does reach the end: a change to the very last entry is found
    await owner("audit_log").where({ id: last[0]!.id }).update({ details: JSON.stringify({ i: -1 }) });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: last[0]!.id });
    await resetLog();
  }, 120_000);
});
