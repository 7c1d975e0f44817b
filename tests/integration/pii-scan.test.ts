import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { gunzipSync } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import type { SessionUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { databaseArchiveSource } from "@/lib/data/exports";
import { startTasks } from "@/lib/data/places";
import { completeSession, fetchSessionByToken, planOf, recordConsent, saveAnswers, saveDeviceCheck } from "@/lib/data/participants";
import { ingestSequenceBatch } from "@/lib/data/recording";
import { randomPseudonyms, writeArchive } from "@/lib/export";
import { sendConsentCopy } from "@/lib/mail/consentCopy";
import { openWithDataKey } from "@/lib/recruitment/dataKey";
import { changeRecruitment, createInvitations, visitPublicLink } from "@/lib/recruitment/service";
import { batchFor } from "../e2e/fixtures/session-batch";
import { createSessionStudy, motionDesign } from "../e2e/fixtures/session-study";
import { readZip } from "../fixtures/readZip";

// The PII scan: after whole sessions that gave an e-mail address, a typed name and a panel id,
// every column of every table and every file of an archive (streams decompressed) is searched for
// the plaintext identifiers. Only their encrypted forms may exist, in the columns made for them.

const EMAIL = "ilmari.kettunen.pii@mailbox.example";
const NAME = "Ilmari Aleksanteri Kettunen";
const PANEL = "PANEL-PII-7f3e91c2d4";
const dir = mkdtempSync(join(tmpdir(), "yawpoint-pii-"));
let owner: SessionUser;

beforeAll(async () => {
  await seedDemo(db);
  const r = await db("users").where({ email: "tomas@harbourview-lab.example" }).first();
  owner = { id: r.id, email: r.email, name: r.name, role: r.role };
});
afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
  await db.destroy();
});

async function runSession(token: string, fx: { consentVersionId: number; consentHash: string }): Promise<void> {
  const ctx = (await fetchSessionByToken(db, token))!;
  const signed = await recordConsent(db, ctx, { consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: NAME, screenShortSidePx: 700 }, "Mozilla/5.0 (PII scan)");
  await sendConsentCopy(db, ctx, EMAIL, "198.51.100.61", signed, `http://127.0.0.1/s/${token}`);
  await saveDeviceCheck(db, (await fetchSessionByToken(db, token))!, { inputs: { motion: true, gamepad: false, touch: true, finePointer: false }, sampleRateHz: 60, jitterSdMs: 1, sourceKind: "device-motion", verdict: "ok" });
  await startTasks(db, (await fetchSessionByToken(db, token))!); // the condition order comes with a place when the tasks start
  const live = (await fetchSessionByToken(db, token))!;
  for (const s of planOf(live)!) await ingestSequenceBatch(db, live, batchFor(live.design, live.participant.id, s));
  for (const c of new Set(planOf(live)!.map((s) => s.condition))) await saveAnswers(db, live, { condition: c, answers: [{ itemId: "effort", valueInt: 4, valueText: null }] });
  await saveAnswers(db, live, { condition: "", answers: [{ itemId: "none", valueInt: null, valueText: null }] });
  await completeSession(db, (await fetchSessionByToken(db, token))!);
}

describe("PII scan", () => {
  it("finds the e-mail, the typed name and the panel id in no column of any table and in no archive file; their encrypted forms open to them", async () => {
    const fx = await createSessionStudy(db, "PII scan", motionDesign, 0);
    // one participant invited by e-mail, one from the public link with a panel id
    const [invited] = await createInvitations(db, owner, fx.studyId, { mode: "email", emails: [EMAIL] });
    const state = await changeRecruitment(db, owner, fx.studyId, { action: "settings", publicLink: true, panelParam: "pid" });
    const visitor = await visitPublicLink(db, state.publicLink!.split("/s/public/")[1]!, { panelId: PANEL });
    await runSession(invited!.token, fx);
    await runSession(visitor.token, fx);
    expect(await db("participants").where({ study_id: fx.studyId, status: "completed" }).count({ n: "*" })).toEqual([{ n: 2 }]);

    // every text-like or binary column of every table, by the server's own catalogue
    const columns = (await db("information_schema.columns").where("table_schema", db.raw("DATABASE()"))
      .whereIn("data_type", ["char", "varchar", "tinytext", "text", "mediumtext", "longtext", "json", "longblob", "blob", "mediumblob", "varbinary", "binary", "enum"])
      .select<{ t: string; c: string }[]>("table_name as t", "column_name as c"));
    expect(columns.length).toBeGreaterThan(50);
    // the scan's own control: a marker put into one column is found there and nowhere else
    const CONTROL = `scan-control-${Date.now()}`;
    await db("studies").where({ id: fx.studyId }).update({ summary: `An invented study (${CONTROL}).` });
    const found: string[] = [];
    for (const { t, c } of columns) {
      for (const needle of [CONTROL, EMAIL, NAME, PANEL, EMAIL.toUpperCase(), "ilmari.kettunen", "Kettunen"]) {
        const [[row]] = (await db.raw("SELECT COUNT(*) AS n FROM ?? WHERE CAST(?? AS BINARY) LIKE CONCAT('%', CAST(? AS BINARY), '%')", [t, c, needle])) as [[{ n: number }]];
        if (Number(row.n) > 0) found.push(`${t}.${c} holds "${needle}"`);
      }
    }
    expect(found).toEqual([`studies.summary holds "${CONTROL}"`]);

    // the encrypted forms are where the design keeps them, and open to the plaintext
    const contact = await db("participant_contacts").where({ participant_id: invited!.id }).first<{ email_encrypted: string }>("email_encrypted");
    expect(openWithDataKey(contact.email_encrypted)).toBe(EMAIL);
    const consents = await db("consent_records as r").join("participants as p", "p.id", "r.participant_id").where("p.study_id", fx.studyId).pluck("r.typed_name_encrypted") as string[];
    expect(consents.map((s) => openWithDataKey(s))).toEqual([NAME, NAME]);
    const panel = await db("participants").where({ id: visitor.id }).first<{ panel_id_encrypted: string }>("panel_id_encrypted");
    expect(openWithDataKey(panel.panel_id_encrypted)).toBe(PANEL);

    // the archive, with everything optional included
    const source = await databaseArchiveSource(db, fx.studyId);
    const path = join(dir, "pii.zip");
    await writeArchive(source, { pseudonyms: "random", includeStreams: true, includeDates: true, includeFreeText: true }, randomPseudonyms(source.participants.map((p) => p.id)), path);
    const files = await readZip(path);
    expect(files.size).toBeGreaterThan(10);
    for (const [name, buf] of files) {
      const text = (name.endsWith(".gz") ? gunzipSync(buf) : buf).toString("utf8");
      for (const needle of [EMAIL, NAME, PANEL, "Kettunen", invited!.token, visitor.token, invited!.code, visitor.code]) expect(text.includes(needle), `${name} holds ${needle}`).toBe(false);
    }
  }, 180_000);
});
