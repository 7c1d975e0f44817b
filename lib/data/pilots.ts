import { gzipSync } from "node:zlib";
import type { Knex } from "knex";
import { z } from "zod";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
import type { Queryable } from "@/lib/db";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { formatSampleCsv } from "@/lib/motion/csv";
import { createSeededRandom, sensorProfiles } from "@/lib/motion/simulate";
import { drawSimulatedPerson, sessionMinutes, simulateSession } from "@/lib/pilot/simulatedSession";
import { insertParticipant, sessionLink } from "@/lib/recruitment/service";
import { planSeedFor, trialUnit, uploadKey } from "@/lib/runner";
import { betweenLevelsFor, orderForParticipant } from "@/lib/study/counterbalance";
import { conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import { auditAs } from "@/lib/study/service/audit";
import { fetchWorkingCopy } from "@/lib/study/service/protocol";
import { createShortLink, shortLinkView } from "./shortLinks";

/** How long a pilot's short link (for a phone) works. */
export const PILOT_LINK_TTL_MS = 3600_000;

export const pilotRequestSchema = z.strictObject({ device: z.enum(["here", "phone"]).default("here") });

/** The working copy a pilot runs, or a 422 saying what is missing. */
async function pilotableDesign(q: Queryable, studyId: number): Promise<StudyDesign> {
  const working = await fetchWorkingCopy(q, studyId);
  if (!working.design) throw unprocessable("Save a valid design first: the pilot runs it.", [{ path: "design", message: "no saved design" }]);
  if (!working.consentBody) throw unprocessable("Write the consent text first: the pilot shows it as participants will see it.", [{ path: "consent", message: "no consent text" }]);
  return working.design;
}

/**
 * Starts a pilot (editor or owner, in any status, draft included): a participant of kind "pilot"
 * running the working copy's design and newest consent text, with a "pilot" banner. It takes no
 * counterbalancing place and no cap place, leaves no consent record, and stays out of results and
 * archives unless the team includes it. For a phone, a short link and QR code that expire in an
 * hour lead to the session.
 */
export async function startPilot(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<{ id: number; code: string; link: string; path: string; shortLink: Awaited<ReturnType<typeof shortLinkView>> | null }> {
  await assertCanEditStudy(db, user, studyId);
  const { device } = pilotRequestSchema.parse(input ?? {});
  const design = await pilotableDesign(db, studyId);
  const { p, link } = await db.transaction(async (trx) => {
    const p = await insertParticipant(trx, studyId, "link", { kind: "pilot", pilot_design: JSON.stringify(design), last_activity_at: new Date() });
    const link = device === "phone" ? await createShortLink(trx, { purpose: "pilot", target: `/s/${p.token}`, ttlMs: PILOT_LINK_TTL_MS, studyId, createdBy: user!.id }) : null;
    await auditAs(trx, user!, "pilot.start", studyId, { code: p.code, device });
    return { p, link };
  });
  const path = `/s/${p.token}`;
  const shortLink = link ? await shortLinkView(link) : null;
  return { id: p.id, code: p.code, link: sessionLink(p.token), path, shortLink };
}

async function pilotRow(q: Queryable, studyId: number, participantId: number): Promise<{ id: number; code: string; kind: "pilot" | "simulated" }> {
  const row = await q("participants").where({ id: participantId, study_id: studyId }).first<{ id: number; code: string; kind: string } | undefined>("id", "code", "kind");
  if (!row) throw notFound("No such participant in this study.");
  if (row.kind === "real") throw conflict(`${row.code} is a real participant: exclude their data, or erase it by their code on request.`);
  return row as { id: number; code: string; kind: "pilot" | "simulated" };
}

/** Deletes a pilot or simulated participant and everything it recorded (editor or owner; never a real participant). */
export async function deletePilot(db: Knex, user: SessionUser | null, studyId: number, participantId: number): Promise<void> {
  await assertCanEditStudy(db, user, studyId);
  const p = await pilotRow(db, studyId, participantId);
  // every table holding a participant's rows refers to participants with ON DELETE CASCADE
  await db.transaction(async (trx) => {
    await trx("participants").where({ id: p.id, study_id: studyId }).whereNot({ kind: "real" }).delete();
    await auditAs(trx, user!, "pilot.delete", studyId, { code: p.code, kind: p.kind });
  });
}

/** Includes a pilot or simulated participant in results and archives, or leaves it out again (editor or owner). */
export async function setPilotIncluded(db: Knex, user: SessionUser | null, studyId: number, participantId: number, included: boolean): Promise<void> {
  await assertCanEditStudy(db, user, studyId);
  const p = await pilotRow(db, studyId, participantId);
  await db.transaction(async (trx) => {
    await trx("participants").where({ id: p.id }).update({ included });
    await auditAs(trx, user!, included ? "pilot.include" : "pilot.leave_out", studyId, { code: p.code, kind: p.kind });
  });
}

export const simulatedPilotSchema = z.strictObject({
  participants: z.number().int().min(1, "Simulate at least 1 participant.").max(48, "At most 48 at a time."),
  /** SD of the logarithm of each person's speed and precision multipliers (0: identical people). */
  spread: z.number().min(0).max(1).default(0.15),
  /** Whether they appear in results and archives (they always can be left out again). */
  include: z.boolean().default(true),
  seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
});

export type SimulatedPilotSummary = { codes: string[]; minutes: { median: number; min: number; max: number }; movements: number };

/**
 * A simulated pilot (runSimulatedPilot, editor or owner): N simulated participants, each a person
 * drawn with the chosen spread, run every sequence of the working copy's design in the order the
 * counterbalancing gives the i-th pilot, through each condition's transfer configuration (the
 * simulated participant of lib/motion/simulate). Their movements, raw streams, device check and
 * rest calibration are stored as a session's would be, so the results page, the time per session
 * and the archive can be seen before anyone real takes part. Kind "simulated": no places, no cap.
 * @throws 422 without a design or for a technique the simulated participant cannot run.
 */
export async function runSimulatedPilot(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<SimulatedPilotSummary> {
  await assertCanEditStudy(db, user, studyId);
  const v = simulatedPilotSchema.parse(input);
  const design = await pilotableDesign(db, studyId);
  const conditions = conditionsOf(design);
  const sensor = sensorProfiles.phone;
  const bias = { biasXDegPerS: sensor.gyroBiasDegPerS.x, biasYDegPerS: sensor.gyroBiasDegPerS.y, biasZDegPerS: sensor.gyroBiasDegPerS.z };
  // the rest calibration finds the sensor's bias; the engine subtracts it, as in a session
  const configs = conditions.map((c) => ({ ...conditionConfig(design, c), ...bias }));
  const rng = createSeededRandom(v.seed ?? Math.floor(Math.random() * 2 ** 31));
  const before = await db("participants").where({ study_id: studyId }).whereNot({ kind: "real" }).whereNotNull("condition_order").count<{ n: number }[]>({ n: "*" });
  let index = Number(before[0]?.n ?? 0);
  const codes: string[] = [];
  const minutes: number[] = [];
  let movements = 0;
  // all of them and the entry commit together, or none (a design the simulation cannot run leaves nothing behind)
  const summary = await db.transaction(async (trx) => {
    for (let k = 0; k < v.participants; k++, index++) {
      const person = drawSimulatedPerson(rng, v.spread);
      const { order } = orderForParticipant(design, index);
      const now = new Date();
      const p = await insertParticipant(trx, studyId, "link", { kind: "simulated", included: v.include, pilot_design: JSON.stringify(design), status: "invited" });
      const planSeed = planSeedFor(design.counterbalancing.seed, p.id);
      let runs;
      try {
        runs = simulateSession(design, conditions.map((c) => c.label), configs, order, planSeed, person, p.code);
      } catch (e) {
        throw unprocessable(`The simulated participant cannot run this design: ${(e as Error).message}.`);
      }
      const total = sessionMinutes(design, runs);
      minutes.push(total);
      const startedAt = new Date(now.getTime() - total * 60_000);
      await trx("participants").where({ id: p.id }).update({
        status: "completed", condition_order: JSON.stringify(order.map((i) => conditions[i]!.label)), between_levels: JSON.stringify(betweenLevelsFor(design, index)),
        device: JSON.stringify({ inputs: { motion: true, gamepad: false, touch: true, finePointer: false }, sampleRateHz: sensor.rateHz, jitterSdMs: sensor.jitterSdMs, sourceKind: "scripted", verdict: "ok" }),
        consented_at: startedAt, started_at: startedAt, completed_at: now, last_activity_at: now,
        progress: JSON.stringify({ stage: "complete", done: runs.length, answered: [], breaks: [] }),
      });
      await trx("calibrations").insert({ participant_id: p.id, kind: "bias", result: JSON.stringify({ ...bias, noiseSdDegPerS: sensor.gyroNoiseSdDegPerS, samples: 120 }) });
      for (const run of runs) {
        const key = uploadKey(p.id, run.planned);
        const unit = trialUnit(design.task.unit);
        await trx("sequence_streams").insert({
          participant_id: p.id, upload_key: key, condition: run.planned.condition, condition_index: run.planned.conditionIndex, block: run.planned.block, sequence: run.planned.sequence,
          practice: run.planned.practice, sample_count: run.samples.length, movement_count: run.trials.length, stream_gz: gzipSync(formatSampleCsv(run.samples), { level: 1 }),
          quality: JSON.stringify({ sampleRateHz: Math.round(run.sampleRateHz * 10) / 10, jitterSdMs: sensor.jitterSdMs, gaps: 0, droppedSamples: 0, frameP99Ms: null }),
        });
        await trx("trials").insert(run.trials.map((t) => ({
          participant_id: p.id, condition: run.planned.condition, condition_index: run.planned.conditionIndex, block: run.planned.block, sequence: run.planned.sequence, trial: t.trial,
          practice: run.planned.practice, unit, amplitude: t.amplitude, width: t.width, from_x: t.from_x, from_y: t.from_y, to_x: t.to_x, to_y: t.to_y,
          start_x: t.start_x, start_y: t.start_y, end_x: t.end_x, end_y: t.end_y, time_ms: t.time_ms, hit: t.hit === 1, upload_key: key,
        })));
        if (!run.planned.practice) movements += run.trials.length;
      }
      codes.push(p.code);
    }
    const sorted = [...minutes].sort((a, b) => a - b);
    const median = sorted.length % 2 ? sorted[(sorted.length - 1) / 2]! : (sorted[sorted.length / 2 - 1]! + sorted[sorted.length / 2]!) / 2;
    const round = (x: number) => Math.round(x * 10) / 10;
    const summary = { codes, minutes: { median: round(median), min: round(sorted[0]!), max: round(sorted.at(-1)!) }, movements };
    await auditAs(trx, user!, "pilot.simulate", studyId, { participants: v.participants, spread: v.spread, included: v.include, codes, minutesMedian: summary.minutes.median });
    return summary;
  });
  return summary;
}
