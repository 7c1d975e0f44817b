import { createHash } from "node:crypto";
import { afterAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { appendAudit, auditCanonical, auditHash, GENESIS_HASH, verifyAuditChain } from "@/lib/data/audit";

afterAll(async () => {
  await db.destroy();
});

describe("audit chain", () => {
  it("hashes SHA-256(prev ‖ canonical JSON): checked against Node's crypto on the FIPS 180-2 'abc' vector", () => {
    // FIPS 180-2, Appendix B.1: SHA-256("abc")
    expect(createHash("sha256").update("abc").digest("hex")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(auditHash("a", "bc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    // RFC 8785: keys sorted, no white space
    expect(auditCanonical({ at: new Date(0), actorUserId: 1, actorLabel: "x", action: "a", studyId: null, details: { b: 2, a: 1 } })).toBe(
      '{"action":"a","actorLabel":"x","actorUserId":1,"at":"1970-01-01T00:00:00.000Z","details":{"a":1,"b":2},"studyId":null}',
    );
  });

  it("appends concurrently without forking, verifies intact, and names the first tampered entry", async () => {
    await db("audit_log").delete();
    await Promise.all(Array.from({ length: 40 }, (_, i) => appendAudit(db, { actorUserId: null, actorLabel: "system", action: "test.append", details: { i } })));
    const rows = await db("audit_log").orderBy("id");
    expect(rows[0].prev_hash).toBe(GENESIS_HASH);
    for (let i = 1; i < rows.length; i++) expect(rows[i].prev_hash).toBe(rows[i - 1].hash);
    expect(await verifyAuditChain(db)).toEqual({ intact: true, entries: 40 });

    const victim = rows[5];
    await db("audit_log").where({ id: victim.id }).update({ details: JSON.stringify({ i: 999 }) });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: victim.id });

    await db("audit_log").where({ id: victim.id }).update({ details: JSON.stringify(typeof victim.details === "string" ? JSON.parse(victim.details) : victim.details) });
    expect(await verifyAuditChain(db)).toEqual({ intact: true, entries: 40 });
    await db("audit_log").where({ id: rows[28].id }).delete();
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: rows[29].id });
  });
});
