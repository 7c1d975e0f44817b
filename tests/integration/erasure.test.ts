import { existsSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import { db } from "@/lib/db";
import { verifyAuditChain } from "@/lib/data/audit";
import { CONSENT_RECORD_COLUMNS, eraseParticipant, PARTICIPANT_COLUMNS, PARTICIPANT_TABLES } from "@/lib/data/erasure";
import { fetchExportFile, insertExportJob, runExportJob } from "@/lib/data/exports";
import {
  completeSession, fetchSessionByToken, planOf, recordConsent, saveAnswers, saveCalibration, saveDeviceCheck, saveProgress, withdrawParticipant, type SessionContext,
} from "@/lib/data/participants";
import { startTasks } from "@/lib/data/places";
import { ingestSequenceBatch } from "@/lib/data/recording";
import { AppError } from "@/lib/errors";
import { sealWithDataKey } from "@/lib/recruitment/dataKey";
import { studyDesignSchema, type StudyDesignInput } from "@/lib/study/design";
import { createSessionStudy, motionDesign, type SessionFixture } from "../e2e/fixtures/session-study";
import { genuineBatch, wire } from "../fixtures/genuineBatch";

// Erasure of a participant (lib/data/erasure.ts) and the guards of every participant write
// (lib/data/participantLock.ts), against MariaDB.

// the final questionnaire asks for comments, so a participant can write their name into one
const withComments: StudyDesignInput = { ...motionDesign, finalQuestionnaire: { ageBand: true, handedness: true, experience: true, comments: true } };
const design = studyDesignSchema.parse(withComments);
const keepDesign: StudyDesignInput = { ...withComments, eraseOnWithdrawal: false };
const NAME = "Aino Kaarina Lehtonen";
const EMAIL = "aino.lehtonen.participant@mailbox.example";
const REASON = "My neighbour Pekka Salo told me the study is run by his sister";

async function consented(fx: SessionFixture, i: number): Promise<SessionContext> {
  const ctx = (await fetchSessionByToken(db, fx.participants[i]!.token))!;
  await recordConsent(db, ctx, { consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: NAME, screenShortSidePx: 700 }, "Mozilla/5.0 (X11; Linux x86_64) Chrome/140");
  await startTasks(db, (await fetchSessionByToken(db, fx.participants[i]!.token))!); // the condition order comes with a place when the tasks start
  return (await fetchSessionByToken(db, fx.participants[i]!.token))!;
}

/** A participant with a row in every table a session writes, and an archive that holds them. */
async function fullParticipant(fx: SessionFixture, i: number): Promise<SessionContext> {
  const ctx = await consented(fx, i);
  const pid = ctx.participant.id;
  await db("participant_contacts").insert({ participant_id: pid, email_encrypted: sealWithDataKey(EMAIL) });
  await db("outgoing_mail").insert({ participant_id: pid, subject: `Invitation to take part: ${fx.studyId}`, template: "study-invitation", status: "sent" });
  await saveDeviceCheck(db, ctx, { inputs: { motion: true, gamepad: false, touch: true, finePointer: false }, sampleRateHz: 60, jitterSdMs: 1, sourceKind: "device-motion", verdict: "ok" });
  await saveCalibration(db, ctx, { kind: "bias", biasXDegPerS: 0.1, biasYDegPerS: 0, biasZDegPerS: 0, noiseSdDegPerS: 0.1, samples: 60 });
  await saveProgress(db, ctx, { stage: "task", done: 1, answered: [], breaks: [] });
  const plan = planOf(ctx)!;
  for (const s of plan.slice(0, 3)) await ingestSequenceBatch(db, ctx, wire(genuineBatch(design, pid, s)));
  await saveAnswers(db, ctx, { condition: plan[0]!.condition, answers: [{ itemId: "effort", valueInt: 4, valueText: null }] });
  await saveAnswers(db, ctx, { condition: "", answers: [{ itemId: "comments", valueInt: null, valueText: `I am ${NAME}` }] });
  return (await fetchSessionByToken(db, fx.participants[i]!.token))!;
}

async function rowsOf(pid: number): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of PARTICIPANT_TABLES) out[t.table] = Number(((await db(t.table).where({ participant_id: pid }).count({ n: "*" })) as { n: number }[])[0]!.n);
  return out;
}

async function auditText(studyId: number): Promise<string> {
  return JSON.stringify(await db("audit_log").where({ study_id: studyId }).select("actor_label", "details"));
}

let fx: SessionFixture;
let keep: SessionFixture;

beforeAll(async () => {
  await seedDemo(db);
  fx = await createSessionStudy(db, "Erasure test", withComments, 4);
  keep = await createSessionStudy(db, "Erasure keep-data test", keepDesign, 2);
});
afterAll(() => db.destroy());

describe("what erasure covers", () => {
  it("lists every table with a participant_id column, and every column of the participant and consent rows", async () => {
    const [cols] = (await db.raw("SELECT table_name AS t, column_name AS c FROM information_schema.columns WHERE table_schema = DATABASE()")) as [{ t: string; c: string }[]];
    const withParticipant = [...new Set(cols.filter((r) => r.c === "participant_id").map((r) => r.t))].sort();
    expect(withParticipant).toEqual(PARTICIPANT_TABLES.map((t) => t.table).sort());
    expect(cols.filter((r) => r.t === "participants").map((r) => r.c).sort()).toEqual(Object.keys(PARTICIPANT_COLUMNS).sort());
    expect(cols.filter((r) => r.t === "consent_records").map((r) => r.c).sort()).toEqual(Object.keys(CONSENT_RECORD_COLUMNS).sort());
  });
});

describe("eraseParticipant", () => {
  it("removes every row of the participant, keeps a tombstone without identifying fields, supersedes the archive that held them and logs no reason", async () => {
    const ctx = await fullParticipant(fx, 0);
    const pid = ctx.participant.id;
    const before = await rowsOf(pid);
    for (const t of ["trials", "sequence_streams", "calibrations", "questionnaire_answers", "participant_contacts", "outgoing_mail"]) expect(before[t], t).toBeGreaterThan(0);
    // an archive that holds the participant
    const owner = await db("users").where({ email: "tomas@harbourview-lab.example" }).first<{ id: number }>("id");
    const jobId = await insertExportJob(db, { studyId: fx.studyId, options: { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: true }, createdBy: owner.id });
    await runExportJob(db, jobId, { id: owner.id, label: "tomas@harbourview-lab.example" });
    const file = await fetchExportFile(db, jobId);
    expect(file?.path && existsSync(file.path)).toBeTruthy();

    const report = await eraseParticipant(db, pid, { actor: { userId: owner.id, label: "tomas@harbourview-lab.example" } });
    expect(report.supersededExports).toEqual([jobId]);
    expect(Object.values(await rowsOf(pid)).reduce((a, b) => a + b, 0) - ((await rowsOf(pid)).consent_records ?? 0)).toBe(0);
    const consent = await db("consent_records").where({ participant_id: pid }).first();
    expect(consent.typed_name_encrypted).toBeNull();
    expect(consent.device_summary).toBeNull();
    expect(consent.erased_at).not.toBeNull();
    expect((consent.signed_at as Date).toISOString()).toMatch(/T00:00:00\.000Z$/);
    const row = await db("participants").where({ id: pid }).first();
    expect(row).toMatchObject({ status: "withdrawn", completion_code: null, progress: null, device: null, condition_order: null, consented_at: null, started_at: null, withdrawal_reason: null });
    expect(row.erased_at).not.toBeNull();
    // the archive: superseded, its file gone, never offered again
    const after = await fetchExportFile(db, jobId);
    expect(after).toMatchObject({ superseded: true, fileDeleted: true, path: null });
    expect(existsSync(file!.path!)).toBe(false);
    // the audit log: the erasure with counts, no name, no reason; the chain intact
    const entry = await db("audit_log").where({ action: "participant.erased", study_id: fx.studyId }).first();
    expect(typeof entry.details === "string" ? JSON.parse(entry.details) : entry.details).toMatchObject({ participant: ctx.participant.code, removed: { trials: before.trials }, supersededExports: [jobId] });
    expect(await auditText(fx.studyId)).not.toContain(NAME);
    expect((await verifyAuditChain(db)).intact).toBe(true);
    // a second erasure changes nothing
    expect((await eraseParticipant(db, pid, { actor: { userId: owner.id, label: "x" } })).alreadyErased).toBe(true);
  });

  it("withdrawal with erasure removes contacts, mail, the typed name and every recorded row, and keeps the participant's reason out of the audit log", async () => {
    const ctx = await fullParticipant(fx, 1);
    expect(await withdrawParticipant(db, ctx, REASON)).toEqual({ erased: true });
    const left = await rowsOf(ctx.participant.id);
    expect({ ...left, consent_records: 0 }).toEqual(Object.fromEntries(PARTICIPANT_TABLES.map((t) => [t.table, 0])));
    expect((await db("consent_records").where({ participant_id: ctx.participant.id }).first()).typed_name_encrypted).toBeNull();
    expect(await auditText(fx.studyId)).not.toContain("Pekka");
    expect(JSON.stringify(await db("participants").where({ id: ctx.participant.id }).first())).not.toContain("Pekka");
  });

  it("withdrawal that keeps the data keeps the reason with the participant (erasable), purges their mail, and logs no reason", async () => {
    const ctx = await consented(keep, 0);
    await db("outgoing_mail").insert({ participant_id: ctx.participant.id, subject: "Your consent", template: "consent-copy", status: "sent" });
    expect(await withdrawParticipant(db, ctx, REASON)).toEqual({ erased: false });
    const row = await db("participants").where({ id: ctx.participant.id }).first();
    expect(row.withdrawal_reason).toBe(REASON);
    expect(await db("outgoing_mail").where({ participant_id: ctx.participant.id }).count({ n: "*" })).toEqual([{ n: 0 }]);
    expect(await auditText(keep.studyId)).not.toContain("Pekka");
    await eraseParticipant(db, ctx.participant.id, { actor: { userId: null, label: "test" } });
    expect((await db("participants").where({ id: ctx.participant.id }).first()).withdrawal_reason).toBeNull();
  });

  it("refuses an unknown participant with 404", async () => {
    await expect(eraseParticipant(db, 987_654_321, { actor: { userId: null, label: "test" } })).rejects.toMatchObject({ status: 404 });
  });
});

describe("participant writes racing a withdrawal with erasure (100 sessions at once)", () => {
  it("never revive a withdrawn session and never leave a row behind the erasure", async () => {
    const race = await createSessionStudy(db, "Erasure race", withComments, 100);
    const contexts = await Promise.all(race.participants.map((_, i) => consented(race, i)));
    // every measured sequence stored, so completion can succeed when it comes first
    await Promise.all(contexts.map(async (ctx) => {
      for (const s of planOf(ctx)!.filter((x) => !x.practice)) await ingestSequenceBatch(db, ctx, wire(genuineBatch(design, ctx.participant.id, s)));
    }));
    // each write holds the session as it was read before the withdrawal: the stale view a request in flight has
    const stale = await Promise.all(race.participants.map(async (p) => (await fetchSessionByToken(db, p.token))!));
    const settle = (p: Promise<unknown>) => p.then(() => "ok", (e: unknown) => {
      if (e instanceof AppError) return String(e.status);
      throw e;
    });
    const outcomes = await Promise.all(stale.map((ctx) => {
      const practice = planOf(ctx)!.find((s) => s.practice)!;
      return Promise.all([
        settle(saveProgress(db, ctx, { stage: "task", done: 5, answered: [], breaks: [] })),
        settle(saveAnswers(db, ctx, { condition: "", answers: [{ itemId: "comments", valueInt: null, valueText: "late words" }] })),
        settle(saveCalibration(db, ctx, { kind: "card", cardWidthPx: 320, pixelsPerMm: 3.74 })),
        settle(saveDeviceCheck(db, ctx, { inputs: { motion: true, gamepad: false, touch: false, finePointer: true }, sampleRateHz: 100, jitterSdMs: 1, sourceKind: "generic-sensor", verdict: "ok" })),
        settle(ingestSequenceBatch(db, ctx, wire(genuineBatch(design, ctx.participant.id, practice)))),
        settle(completeSession(db, ctx)),
        settle(withdrawParticipant(db, ctx, "race")),
      ]);
    }));
    expect(outcomes.flat().filter((o) => o !== "ok" && !["409", "410"].includes(o))).toEqual([]);
    const rows = await db("participants").whereIn("id", stale.map((c) => c.participant.id)).select("id", "status", "erased_at", "device", "progress");
    expect(rows.filter((r) => r.status !== "withdrawn" || r.erased_at === null || r.device !== null || r.progress !== null).map((r) => r.id)).toEqual([]);
    for (const t of PARTICIPANT_TABLES.filter((x) => x.onErase === "delete")) {
      const n = await db(t.table).whereIn("participant_id", stale.map((c) => c.participant.id)).count({ n: "*" });
      expect(n, t.table).toEqual([{ n: 0 }]);
    }
    expect((await verifyAuditChain(db)).intact).toBe(true);
  }, 180_000);
});
