import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import { db } from "@/lib/db";
import type { SessionUser } from "@/lib/auth/guards";
import { AppError } from "@/lib/errors";
import { addExclusion, fetchResearcherExclusions, revokeExclusion } from "@/lib/data/exclusions";
import { eraseByCode } from "@/lib/data/erasureRequests";
import { databaseArchiveSource } from "@/lib/data/exports";
import { consentForSession, completeSession, fetchSessionByToken, recordConsent, saveDeviceCheck, withdrawParticipant, planOf, type SessionContext } from "@/lib/data/participants";
import { countTowardCap, fetchPlaceBalance, startTasks } from "@/lib/data/places";
import { deletePilot, runSimulatedPilot, setPilotIncluded, startPilot } from "@/lib/data/pilots";
import { fetchParticipantList } from "@/lib/data/participantList";
import { ingestSequenceBatch } from "@/lib/data/recording";
import { fetchResultsParticipants, fetchStudyDesign, fetchStudyTrialRecords } from "@/lib/data/results";
import { insertStudy } from "@/lib/data/studies";
import { changeRecruitment, insertParticipant } from "@/lib/recruitment/service";
import { buildResultsView } from "@/lib/results";
import { saveConsentDraft } from "@/lib/study/service/consent";
import { saveDesign } from "@/lib/study/service/design";
import { saveInvitationText, updateStudyMeta } from "@/lib/study/service/meta";
import { cloneStudy } from "@/lib/study/service/clone";
import { decideReview, submitForReview } from "@/lib/study/service/review";
import { studyDesignSchema, type StudyDesignInput } from "@/lib/study/design";
import { batchFor } from "../e2e/fixtures/session-batch";

// Pilots, amendments, counterbalancing with replacement, the cap and exclusions, against MariaDB.

const CONSENT = "## Purpose\nAiming with a phone, about 20 minutes.\n\n## Risks\nWrist strain, motion sickness, flashing.\n\n- [ ] I agree to take part.\n";

/** Four conditions of one factor: a Williams square of 4 rows (Williams 1949, n even). */
const FOUR: StudyDesignInput = {
  baseConfig: { technique: "motion", displayMode: "cursor", pixelsPerDegree: 10 },
  factors: [{ name: "gain", levels: [1, 2, 3, 4].map((g) => ({ label: `gain ${g}`, config: { gain: g } })) }],
  task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [300], widths: [30], targetsPerRing: 5, sequencesPerAW: 1, practiceSequences: 0, selection: "tap" },
  minBreakSeconds: 0,
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 4,
  eraseOnWithdrawal: false,
};

let owner: SessionUser, reviewer: SessionUser;
const user = async (email: string): Promise<SessionUser> => {
  const r = await db("users").where({ email }).first();
  return { id: r.id, email: r.email, name: r.name, role: r.role };
};
const status = async (p: Promise<unknown>) => p.then(() => 200, (e: unknown) => (e instanceof AppError ? e.status : (e as { name?: string }).name === "ZodError" ? 422 : 500));

beforeAll(async () => {
  await seedDemo(db);
  owner = await user("tomas@harbourview-lab.example");
  reviewer = await user("ethics@harbourview-lab.example");
});
afterAll(() => db.destroy());

/** An approved, recruiting study of the given design, through the services as a team would do it. */
async function recruitingStudy(design: StudyDesignInput, cap: number | null = null): Promise<number> {
  const id = await insertStudy(db, { title: `Lifecycle ${Date.now()} ${Math.random()}`, summary: "Version one information.", protocolNumber: null, ownerId: owner.id });
  await saveDesign(db, owner, id, design);
  await saveConsentDraft(db, owner, id, { body: CONSENT });
  await submitForReview(db, owner, id);
  await decideReview(db, reviewer, id, { decision: "approve" });
  await changeRecruitment(db, owner, id, { action: "open", participantCap: cap });
  return id;
}

async function ctxOf(token: string): Promise<SessionContext> {
  return (await fetchSessionByToken(db, token))!;
}

async function consent(token: string): Promise<void> {
  const ctx = await ctxOf(token);
  const v = (await consentForSession(db, ctx))!;
  await recordConsent(db, ctx, { consentVersionId: v.id, versionHash: v.sha256!, agreed: ["s1"], screenShortSidePx: 400 }, null);
}

const OK_DEVICE = { inputs: { motion: true, gamepad: false, touch: true, finePointer: false }, sampleRateHz: 60, jitterSdMs: 1, sourceKind: "device-motion" as const, verdict: "ok" as const };

/** Device check passed, tasks started, every planned sequence uploaded, completed. */
async function finish(token: string): Promise<void> {
  await saveDeviceCheck(db, await ctxOf(token), OK_DEVICE);
  await startTasks(db, await ctxOf(token));
  const ctx = await ctxOf(token);
  for (const s of planOf(ctx)!) await ingestSequenceBatch(db, ctx, batchFor(ctx.design, ctx.participant.id, s));
  await completeSession(db, await ctxOf(token));
}

describe("counterbalancing with replacement and the cap", () => {
  it("four start, one is refused at the device check, one withdraws; the next two fill the free rows and the completed stay balanced", async () => {
    const studyId = await recruitingStudy(FOUR, 4);
    const made: Awaited<ReturnType<typeof insertParticipant>>[] = [];
    for (let i = 0; i < 7; i++) made.push(await insertParticipant(db, studyId, "link")); // one by one: ids in this order
    const [a, b, c, d, e, f, g] = made;
    for (const p of [a!, b!, c!, d!]) await consent(p.token);
    expect((await ctxOf(a!.token)).participant.cb_slot).toBeNull(); // no place at consent
    await saveDeviceCheck(db, await ctxOf(a!.token), { ...OK_DEVICE, sampleRateHz: 12, verdict: "refused" });
    for (const p of [b!, c!, d!]) {
      await saveDeviceCheck(db, await ctxOf(p.token), OK_DEVICE);
      await startTasks(db, await ctxOf(p.token));
    }
    expect([b!, c!, d!].map((p) => p.id)).toEqual([b!.id, c!.id, d!.id]);
    const rowsOf = async (ps: { id: number }[]) => (await db("participants").whereIn("id", ps.map((p) => p.id)).orderBy("id").select("cb_row")).map((r: { cb_row: number }) => r.cb_row);
    expect(await rowsOf([b!, c!, d!])).toEqual([0, 1, 2]);
    await withdrawParticipant(db, await ctxOf(c!.token));
    expect(await countTowardCap(db, studyId, new Date())).toBe(2); // b and d: the refused and the withdrawn count no more
    for (const p of [e!, f!]) await consent(p.token);
    await finish(e!.token); // e takes row 1, which c gave back
    await finish(f!.token); // f takes row 3, the first never taken
    expect(await rowsOf([e!, f!])).toEqual([1, 3]);
    for (const p of [b!, d!]) {
      const ctx = await ctxOf(p.token);
      for (const s of planOf(ctx)!) await ingestSequenceBatch(db, ctx, batchFor(ctx.design, ctx.participant.id, s));
      await completeSession(db, await ctxOf(p.token));
    }
    // the cap of 4 is full with the four who completed: a seventh is refused at consent
    expect(await status(consent(g!.token))).toBe(409);

    // the completed participants' orders form a balanced Latin square (Williams 1949, even n = 4):
    // each condition once in every position, and each ordered pair of neighbours exactly once
    const orders = (await db("participants").where({ study_id: studyId, status: "completed" }).select("condition_order")).map((r: { condition_order: unknown }) =>
      (typeof r.condition_order === "string" ? JSON.parse(r.condition_order) : r.condition_order) as string[]);
    expect(orders).toHaveLength(4);
    for (let pos = 0; pos < 4; pos++) expect(new Set(orders.map((o) => o[pos])).size).toBe(4);
    const pairs = orders.flatMap((o) => o.slice(1).map((x, i) => `${o[i]}→${x}`));
    expect(new Set(pairs).size).toBe(12); // 4 × 3 ordered pairs, none repeated
    const design = (await fetchStudyDesign(db, studyId))!;
    const balance = await fetchPlaceBalance(db, studyId, design);
    expect(balance.cells.map((c) => [c.completed, c.inProgress, c.free])).toEqual([[1, 0, 0], [1, 0, 0], [1, 0, 0], [1, 0, 0]]);
    const list = await fetchParticipantList(db, studyId, { isOwner: false });
    expect(list.find((p) => p.id === c!.id)!.place).toBe("released: withdrew");
    expect(list.find((p) => p.id === a!.id)!.place).toBe("released: device check");
    expect(list.find((p) => p.id === a!.id)!.deviceVerdict).toBe("refused");
  });

  it("a participant inactive for longer than the study allows gives the place to the next one", async () => {
    const studyId = await recruitingStudy(FOUR);
    await changeRecruitment(db, owner, studyId, { action: "settings", inactivityMinutes: 30 });
    const a = await insertParticipant(db, studyId, "link");
    const b = await insertParticipant(db, studyId, "link");
    await consent(a.token);
    await startTasks(db, await ctxOf(a.token));
    await db("participants").where({ id: a.id }).update({ last_activity_at: new Date(Date.now() - 31 * 60_000) });
    await consent(b.token);
    await startTasks(db, await ctxOf(b.token));
    const row = (id: number) => db("participants").where({ id }).first("cb_row", "cb_release_reason");
    expect([await row(a.id), await row(b.id)]).toEqual([{ cb_row: 0, cb_release_reason: "inactive" }, { cb_row: 0, cb_release_reason: null }]);
  });
});

describe("amendments", () => {
  it("a participant keeps the version they consented to; new participants run the approved amendment", async () => {
    const studyId = await recruitingStudy(FOUR);
    const early = await insertParticipant(db, studyId, "link");
    await consent(early.token);
    await startTasks(db, await ctxOf(early.token));
    // recruiting goes on while the amendment is written and reviewed
    await updateStudyMeta(db, owner, studyId, { title: "Aiming, amended", summary: "Version two information.", protocolNumber: "" });
    await saveDesign(db, owner, studyId, { ...FOUR, blocks: 2 });
    expect((await ctxOf(early.token)).design.blocks).toBe(1);
    const waiting = await insertParticipant(db, studyId, "link");
    expect((await ctxOf(waiting.token)).study.summary).toBe("Version one information."); // not yet approved
    await submitForReview(db, owner, studyId);
    await decideReview(db, reviewer, studyId, { decision: "approve" });
    const late = await ctxOf(waiting.token);
    expect(late.design.blocks).toBe(2);
    expect(late.study.summary).toBe("Version two information.");
    expect(late.protocolVersion!.version).toBe(2);
    const kept = await ctxOf(early.token);
    expect(kept.design.blocks).toBe(1);
    expect(kept.protocolVersion!.version).toBe(1);
    expect(planOf(kept)).toHaveLength(4); // 4 conditions × 1 block
    await consent(waiting.token);
    const versions = new Map((await fetchResultsParticipants(db, studyId)).map((p) => [p.id, p.protocolVersion]));
    expect([versions.get(early.id), versions.get(waiting.id)]).toEqual([1, 2]);
    // the archive's participants say which version each ran (participants.csv's protocol_version)
    const archived = new Map((await databaseArchiveSource(db, studyId)).participants.map((p) => [p.id, p.protocolVersion]));
    expect([archived.get(early.id), archived.get(waiting.id)]).toEqual([1, 2]);
  });
});

describe("cloning", () => {
  it("makes a new draft of the cloner's with the information, design, consent and invitation text, and nothing of the participants or the review", async () => {
    const studyId = await recruitingStudy(FOUR);
    await saveInvitationText(db, owner, studyId, { text: "We invite you to aim at targets with your phone." }); // an amendment's working copy
    const someone = await insertParticipant(db, studyId, "link");
    await consent(someone.token);
    const viewer = await user("priya@harbourview-lab.example");
    // a researcher outside the team cannot copy someone's protocol; a viewer on the team can
    expect(await status(cloneStudy(db, viewer, studyId))).toBe(403);
    await db("study_members").insert({ study_id: studyId, user_id: viewer.id, role: "viewer" });
    const { id } = await cloneStudy(db, viewer, studyId);
    const [from, copy] = await Promise.all([db("studies").where({ id: studyId }).first(), db("studies").where({ id }).first()]);
    expect(copy).toMatchObject({ status: "draft", owner_id: viewer.id, title: `${from.title} (copy)`, summary: from.summary, design_hash: from.design_hash, invitation_text: "We invite you to aim at targets with your phone." });
    const consents = await db("consent_versions").where({ study_id: id }).select("version", "status", "body_md");
    expect(consents).toEqual([{ version: 1, status: "draft", body_md: CONSENT }]);
    for (const t of ["participants", "study_reviews", "study_documents"]) expect(await db(t).where({ study_id: id }).count<{ n: number }[]>({ n: "*" }), t).toEqual([{ n: 0 }]);
  });
});

describe("withdrawal after completion", () => {
  it("is still open through the participant's link: the completed participant is withdrawn and their place freed for the next", async () => {
    const studyId = await recruitingStudy(FOUR);
    const done = await insertParticipant(db, studyId, "link");
    await consent(done.token);
    await finish(done.token);
    const placed = await db("participants").where({ id: done.id }).first<{ status: string; cb_slot: number }>();
    expect(placed.status).toBe("completed");
    await withdrawParticipant(db, await ctxOf(done.token), "changed my mind after the session");
    expect(await db("participants").where({ id: done.id }).first()).toMatchObject({ status: "withdrawn", cb_release_reason: "withdrawn" });
    // the next participant takes the place the withdrawn one held
    const next = await insertParticipant(db, studyId, "link");
    await consent(next.token);
    await saveDeviceCheck(db, await ctxOf(next.token), OK_DEVICE);
    await startTasks(db, await ctxOf(next.token));
    expect((await db("participants").where({ id: next.id }).first<{ cb_slot: number }>()).cb_slot).toBe(placed.cb_slot);
  });
});

describe("pilots", () => {
  it("run a draft without a place or a consent record, stay out of results unless included, and are deleted with every row", async () => {
    const studyId = await insertStudy(db, { title: `Pilot draft ${Date.now()}`, summary: "", protocolNumber: null, ownerId: owner.id });
    expect(await status(startPilot(db, owner, studyId, { device: "here" }))).toBe(422); // nothing to run yet
    await saveDesign(db, owner, studyId, FOUR);
    await saveConsentDraft(db, owner, studyId, { body: CONSENT });
    const pilot = await startPilot(db, owner, studyId, { device: "phone" });
    expect(pilot.shortLink!.url).toMatch(/\/go\/[2-9A-Z]{8}$/);
    const token = pilot.path.slice("/s/".length);
    await consent(token); // a draft: no recruiting, no approved consent
    await startTasks(db, await ctxOf(token));
    const ctx = await ctxOf(token);
    expect(ctx.participant.kind).toBe("pilot");
    expect(ctx.participant.cb_slot).toBeNull();
    for (const s of planOf(ctx)!) await ingestSequenceBatch(db, ctx, batchFor(ctx.design, ctx.participant.id, s));
    await completeSession(db, await ctxOf(token));
    expect(await db("consent_records").where({ participant_id: pilot.id }).first()).toBeUndefined();
    expect(await fetchResultsParticipants(db, studyId)).toEqual([]);
    expect(await fetchStudyTrialRecords(db, studyId)).toEqual([]);
    await setPilotIncluded(db, owner, studyId, pilot.id, true);
    expect((await fetchResultsParticipants(db, studyId)).map((p) => p.kind)).toEqual(["pilot"]);
    expect(await fetchStudyTrialRecords(db, studyId)).toHaveLength(4 * 5);
    await deletePilot(db, owner, studyId, pilot.id);
    for (const table of ["participants", "trials", "sequence_streams", "calibrations", "questionnaire_answers"]) {
      const col = table === "participants" ? "id" : "participant_id";
      expect(await db(table).where({ [col]: pilot.id }).count<{ n: number }[]>({ n: "*" }), table).toEqual([{ n: 0 }]);
    }
  });

  it("a simulated pilot fills the results: throughput close to the simulated person's Fitts model", async () => {
    const studyId = await insertStudy(db, { title: `Simulated ${Date.now()}`, summary: "", protocolNumber: null, ownerId: owner.id });
    const design = { ...FOUR, factors: [{ name: "gain", levels: [{ label: "gain 2", config: { gain: 2 } }, { label: "gain 4", config: { gain: 4 } }] }], task: { ...FOUR.task, amplitudes: [200, 400], widths: [20, 40], targetsPerRing: 9 } };
    await saveDesign(db, owner, studyId, design);
    await saveConsentDraft(db, owner, studyId, { body: CONSENT });
    const summary = await runSimulatedPilot(db, owner, studyId, { participants: 3, spread: 0, include: true, seed: 11 });
    expect(summary.codes).toHaveLength(3);
    const parsed = studyDesignSchema.parse(design);
    const view = buildResultsView(parsed, await fetchResultsParticipants(db, studyId), await fetchStudyTrialRecords(db, studyId));
    expect(view.analysis!.cells).toHaveLength(3 * 2);
    // The simulated person moves in MT = 300 + 150·ID ms (lib/motion/simulate defaults) with endpoint SD W/4.133, so We ≈ W
    // and TP ≈ ID/MT with ID = log2(A/W + 1) (Shannon form, MacKenzie 1992), averaged over the four A×W pairs.
    const ids = [200, 400].flatMap((a) => [20, 40].map((w) => Math.log2(a / w + 1)));
    const expected = ids.reduce((acc, id) => acc + id / ((300 + 150 * id) / 1000), 0) / ids.length;
    for (const c of view.analysis!.conditions) expect(Math.abs(c.tp.mean! - expected) / expected, c.condition).toBeLessThan(0.12);
    // a session takes at least the movements' own Fitts times
    const movementMinutes = (2 * 4 * 9 * ids.reduce((a, id) => a + (300 + 150 * id), 0) / 4) / 60_000;
    expect(summary.minutes.min).toBeGreaterThan(movementMinutes);
  });
});

describe("simulated pilots of other techniques", () => {
  it("run a stick and a motion condition in view mode (the simulated participant of every technique)", async () => {
    const studyId = await insertStudy(db, { title: `Simulated view ${Date.now()}`, summary: "", protocolNumber: null, ownerId: owner.id });
    await saveDesign(db, owner, studyId, {
      factors: [{ name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }, { label: "stick", config: { technique: "stick" } }] }],
      task: { type: "ring", displayMode: "view", unit: "deg-view", amplitudes: [20], widths: [4], targetsPerRing: 7, practiceSequences: 0 },
      counterbalancing: { method: "williams", seed: 2 },
    });
    await saveConsentDraft(db, owner, studyId, { body: CONSENT });
    const summary = await runSimulatedPilot(db, owner, studyId, { participants: 1, spread: 0, include: true, seed: 3 });
    expect(summary.movements).toBe(2 * 7);
    const techniques = (await db("trials as t").join("participants as p", "p.id", "t.participant_id").where("p.study_id", studyId).distinct("t.condition")).map((r: { condition: string }) => r.condition).sort();
    expect(techniques).toEqual(["motion", "stick"]);
  });
});

describe("exclusions", () => {
  it("leave a participant's or a sequence's movements out of results and archives, are listed with reasons, and can be taken back", async () => {
    const studyId = await recruitingStudy(FOUR);
    const people = await Promise.all([0, 1].map(() => insertParticipant(db, studyId, "link")));
    for (const p of people) {
      await consent(p.token);
      await finish(p.token);
    }
    const before = await fetchStudyTrialRecords(db, studyId);
    expect(before).toHaveLength(2 * 4 * 5);
    const seq = await db("sequence_streams").where({ participant_id: people[0]!.id }).orderBy("id").first<{ condition_index: number; block: number; sequence: number }>();
    const x1 = await addExclusion(db, owner, studyId, { scope: "sequence", participantId: people[0]!.id, conditionIndex: seq.condition_index, block: seq.block, sequence: seq.sequence, reason: "phone set down during the round" });
    expect(x1.movements).toBe(5);
    expect(await status(addExclusion(db, owner, studyId, { scope: "sequence", participantId: people[0]!.id, conditionIndex: seq.condition_index, block: seq.block, sequence: seq.sequence, reason: "twice" }))).toBe(409);
    const x2 = await addExclusion(db, owner, studyId, { scope: "participant", participantId: people[1]!.id, reason: "sensor rate too low" });
    expect(await fetchStudyTrialRecords(db, studyId)).toHaveLength(4 * 5 - 5);
    const source = await databaseArchiveSource(db, studyId);
    let archived = 0;
    for await (const _ of source.trials()) archived++;
    expect(archived).toBe(4 * 5 - 5);
    expect(source.participants.find((p) => p.id === people[1]!.id)!.excluded).toBe(true);
    expect((await fetchResearcherExclusions(db, studyId)).map((e) => [e.scope, e.reason, e.movements])).toEqual([["sequence", "phone set down during the round", 5], ["participant", "sensor rate too low", 20]]);
    await revokeExclusion(db, owner, studyId, x2.id);
    await revokeExclusion(db, owner, studyId, x1.id);
    expect(await fetchStudyTrialRecords(db, studyId)).toHaveLength(2 * 4 * 5);
    const audit = await db("audit_log").where({ study_id: studyId }).whereIn("action", ["exclusion.add", "exclusion.revoke"]).count<{ n: number }[]>({ n: "*" });
    expect(audit).toEqual([{ n: 4 }]);
  });
});

describe("erasure by code", () => {
  it("is the owner's, takes the code as the participant quotes it, and keeps to the window the consent text states", async () => {
    const studyId = await recruitingStudy(FOUR);
    const [a, b] = [await insertParticipant(db, studyId, "link"), await insertParticipant(db, studyId, "link")];
    for (const p of [a, b]) {
      await consent(p.token);
      await finish(p.token);
    }
    const editor = await user("priya@harbourview-lab.example");
    expect(await status(eraseByCode(db, editor, studyId, { code: a.code, confirm: true }))).toBe(403);
    expect(await status(eraseByCode(db, owner, studyId, { code: "P-ZZZZZZ", confirm: true }))).toBe(404);
    // version 1 stated no window: erasure at any time, the code typed in lower case without its dash
    const report = await eraseByCode(db, owner, studyId, { code: a.code.toLowerCase().replace("-", ""), confirm: true });
    expect(report.removed.trials).toBe(4 * 5);
    // a window of 30 days, counted from the end of the session (here 31 days ago)
    await db("study_reviews").where({ study_id: studyId }).update({ erasure_window_days: 30 });
    await db("participants").where({ id: b.id }).update({ completed_at: new Date(Date.now() - 31 * 86_400_000) });
    expect(await status(eraseByCode(db, owner, studyId, { code: b.code, confirm: true }))).toBe(409);
    expect(await status(eraseByCode(db, owner, studyId, { code: b.code, confirm: true }, new Date(Date.now() - 2 * 86_400_000)))).toBe(200);
  });
});
