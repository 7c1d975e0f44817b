import { createHash, randomBytes } from "node:crypto";
import { gzipSync } from "node:zlib";
import canonicalize from "canonicalize";
import type { Knex } from "knex";
import { appendAudit } from "../../lib/data/audit";
import { addTeamMember, insertStudy } from "../../lib/data/studies";
import { formatSampleCsv } from "../../lib/motion/csv";
import type { MotionSample } from "../../lib/motion/sample";
import { createSeededRandom, simulateSequence, type SeededRandom } from "../../lib/motion/simulate";
import { orderForParticipant } from "../../lib/study/counterbalance";
import { conditionConfig, conditionsOf, studyDesignSchema, type StudyDesign } from "../../lib/study/design";
import { ringTargets, ringVisitingOrder } from "../../lib/task";

/**
 * A finished demo study in the invented Harbourview scenario: 12 simulated participants who
 * aimed with phone motion or touch drag at two gains, so a newcomer sees results and can export
 * on the first start. Every number comes from lib/motion/simulate's simulated participant with a
 * fixed seed; the people, answers and wording are our own invention.
 */
export const FINISHED_STUDY = {
  title: "Phone motion versus touch drag at two CD gains (finished pilot)",
  summary:
    "A finished pilot of the Harbourview Interaction Lab: twelve participants point at ISO 9241-411 ring targets in a 2-D cursor task, " +
    "with phone motion or a touch drag, each at a low and a high CD gain, in two blocks. The data are simulated for the demo.",
  protocolNumber: "NMU-HREC-2026-094",
  ownerEmail: "tomas@harbourview-lab.example",
  reviewerEmail: "ethics@harbourview-lab.example",
  team: [{ email: "priya@harbourview-lab.example", role: "editor" as const }],
};

const CONSENT_TEXT = `# Taking part in the aiming pilot

The Harbourview Interaction Lab at Northmere University asks you to point at targets on your phone's screen, by turning the phone or by dragging a finger, for about 25 minutes.

- Taking part is voluntary. You may stop at any moment without giving a reason, and ask us to erase what you recorded.
- We record your movements, the phone's motion sensor readings and your answers. We do not record your name.
- Repeated wrist turns can tire the hand: take the breaks offered, and stop if anything hurts.
- Anonymised data (no names, no contact details) may be shared openly for other researchers.

Questions: the lab's study desk, or the university's ethics office (protocol NMU-HREC-2026-094).
`;

export const FINISHED_DESIGN_INPUT = {
  baseConfig: { displayMode: "cursor", pixelsPerDegree: 12 },
  factors: [
    { name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }, { label: "touch", config: { technique: "touch" } }] },
    { name: "gain", levels: [{ label: "low", config: { gain: 2, pointerCursorGain: 1 } }, { label: "high", config: { gain: 5, pointerCursorGain: 2 } }] },
  ],
  task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [240, 480], widths: [24, 60], targetsPerRing: 9, sequencesPerAW: 1, practiceSequences: 1, selection: "tap" },
  blocks: 2,
  perConditionItems: [{ id: "effort", text: "How much effort did aiming take in this condition?", points: 7, lowLabel: "very little", highLabel: "a great deal" }],
  finalQuestionnaire: { ageBand: true, handedness: true, experience: true, comments: true },
  counterbalancing: { method: "williams", seed: 7 },
  plannedParticipants: 12,
} as const;

const AGE_BANDS = ["18-24", "25-34", "25-34", "35-44", "18-24", "45-54", "25-34", "18-24", "35-44", "25-34", "55-64", "18-24"];
const HANDS = ["right", "right", "left", "right", "right", "right", "both", "right", "right", "left", "right", "right"];
const COMMENTS = [
  "The small targets were hard with the high gain.",
  "Touch felt quicker; turning the phone was fun but tiring.",
  "",
  "I overshot a lot at first with motion.",
  "",
  "Fine overall.",
  "My wrist got tired in the second block.",
  "",
  "Dragging was easy.",
  "",
  "Motion at the low gain needed big turns.",
  "",
];

/** Plausible person-by-condition movement parameters (invented; within the typical ranges of science.md §1). */
function personFor(rng: SeededRandom, factorLevels: Record<string, string>, block: number, person: { speed: number; precision: number }) {
  const motion = factorLevels.technique === "motion";
  const high = factorLevels.gain === "high";
  let intercept = motion ? 330 : 240;
  let slope = motion ? 230 : 160;
  let spread = 0.8;
  if (high) {
    intercept -= motion ? 40 : 20;
    slope += motion ? 30 : 8;
    spread = motion ? 1.15 : 1.05;
  }
  const learn = block >= 2 ? 0.93 : 1;
  return {
    seed: Math.floor(rng.uniform() * 2 ** 31),
    interceptMs: intercept * person.speed * learn,
    slopeMsPerBit: slope * person.speed * learn,
    spreadFactor: spread * person.precision,
    sensor: "phone" as const,
    restMs: 300,
    timingSdFraction: 0.08,
  };
}

const r = (x: number | undefined, q: number): number | undefined => (x === undefined ? undefined : Math.round(x * q) / q);
/** A sample as a browser would record it: rates already coarse, accelerations to 0.001 m/s², times to 1 µs. */
const recorded = (s: MotionSample): MotionSample => ({
  ...s, tMs: r(s.tMs, 1000)!, gyroX: r(s.gyroX, 1e4)!, gyroY: r(s.gyroY, 1e4)!, gyroZ: r(s.gyroZ, 1e4)!, accelX: r(s.accelX, 1000), accelY: r(s.accelY, 1000), accelZ: r(s.accelZ, 1000),
  pointerDx: r(s.pointerDx, 1e4), pointerDy: r(s.pointerDy, 1e4),
});

const CODE_ALPHABET = "ABCDEFGHJKMNPQRSTVWXYZ23456789";

/**
 * Seeds the finished demo study (idempotent: nothing happens when a study of that title exists).
 * Returns what it added, for the seed's report.
 */
export async function seedFinishedStudy(db: Knex, userIds: ReadonlyMap<string, number>): Promise<string[]> {
  const existing = await db("studies").where({ title: FINISHED_STUDY.title }).first<{ id: number } | undefined>("id");
  if (existing) return [];
  const ownerId = userIds.get(FINISHED_STUDY.ownerEmail);
  const reviewerId = userIds.get(FINISHED_STUDY.reviewerEmail);
  if (ownerId === undefined || reviewerId === undefined) throw new Error("seedFinishedStudy: the demo owner or reviewer is missing");
  const design: StudyDesign = studyDesignSchema.parse(FINISHED_DESIGN_INPUT);
  const conditions = conditionsOf(design);
  const rng = createSeededRandom(20260301);
  const day = (d: number, minutes = 0) => new Date(Date.UTC(2026, 2, 2 + d, 9, 0, 0) + minutes * 60_000);

  await db.transaction(async (trx) => {
    const studyId = await insertStudy(trx, { title: FINISHED_STUDY.title, summary: FINISHED_STUDY.summary, protocolNumber: FINISHED_STUDY.protocolNumber, ownerId });
    for (const m of FINISHED_STUDY.team) {
      const uid = userIds.get(m.email);
      if (uid !== undefined) await addTeamMember(trx, studyId, uid, m.role);
    }
    const designText = canonicalize(design);
    await trx("studies").where({ id: studyId }).update({
      status: "closed",
      design: JSON.stringify(design),
      design_hash: designText ? createHash("sha256").update(designText, "utf8").digest("hex") : null,
    });
    const consentHash = createHash("sha256").update(CONSENT_TEXT, "utf8").digest("hex");
    const [consentId] = await trx("consent_versions").insert({
      study_id: studyId, version: 1, body_md: CONSENT_TEXT, sha256: consentHash, status: "approved",
      created_by: ownerId, created_at: day(-20), submitted_at: day(-19), decided_by: reviewerId, decided_at: day(-14), decision_comment: "Approved as written.",
    });
    // protocol version 1: what the reviewer approved (information, design, consent) and every participant ran
    const [protocolId] = await trx("study_reviews").insert({
      study_id: studyId, consent_version_id: Number(consentId), version: 1, status: "approved", title: FINISHED_STUDY.title, summary: FINISHED_STUDY.summary,
      design: JSON.stringify(design), design_hash: designText ? createHash("sha256").update(designText, "utf8").digest("hex") : "", erasure_window_days: null,
      submitted_by: ownerId, submitted_at: day(-19), decided_by: reviewerId, decided_at: day(-14), comment: "Approved as written.",
    });

    for (let i = 0; i < 12; i++) {
      const code = "P-" + Array.from({ length: 6 }, () => CODE_ALPHABET[Math.floor(rng.uniform() * CODE_ALPHABET.length)]).join("");
      const { row, order } = orderForParticipant(design, i); // Williams square, 4 rows (science.md §5)
      const started = day(Math.floor(i / 2), 60 * (i % 2) * 3);
      const person = { speed: 0.85 + 0.3 * rng.uniform(), precision: 0.85 + 0.3 * rng.uniform() };
      const [pid] = await trx("participants").insert({
        study_id: studyId, code, token_hash: createHash("sha256").update(randomBytes(16)).digest("hex"), source: "link", status: "completed",
        cb_row: row, cb_slot: i, protocol_version_id: Number(protocolId), condition_order: JSON.stringify(order.map((k) => conditions[k]!.label)), between_levels: JSON.stringify({}),
        completion_code: `HV-${code.slice(2)}`, device: JSON.stringify({ inputs: ["gyroscope", "touch"], sensorRateHz: 60 }),
        created_at: day(Math.floor(i / 2) - 1), consented_at: new Date(started.getTime() - 60_000), started_at: started,
        completed_at: new Date(started.getTime() + (22 + Math.floor(rng.uniform() * 8)) * 60_000), last_activity_at: new Date(started.getTime() + 30 * 60_000),
      });
      const participantId = Number(pid);
      await trx("consent_records").insert({
        participant_id: participantId, consent_version_id: Number(consentId), version_hash: consentHash,
        agreed: JSON.stringify(["take-part", "recording", "open-data"]), signed_at: new Date(started.getTime() - 60_000),
        device_summary: JSON.stringify({ deviceClass: "phone", browserFamily: "mobile", screenBand: "small" }),
      });
      // the phone profile's bias, as the session's rest calibration would find it; the engine subtracts it
      const bias = { biasXDegPerS: 0.3, biasYDegPerS: -0.2, biasZDegPerS: 0.15 };
      await trx("calibrations").insert({ participant_id: participantId, kind: "bias", result: JSON.stringify({ ...bias, noiseSdDegPerS: 0.15, samples: 60 }), created_at: started });

      const trialRows: Record<string, unknown>[] = [];
      const streamRows: Record<string, unknown>[] = [];
      let clock = 2;
      for (const [pos, k] of order.entries()) {
        const condition = conditions[k]!;
        const config = { ...conditionConfig(design, condition), ...bias };
        for (let block = 1; block <= design.blocks; block++) {
          const pairs = design.task.amplitudes.flatMap((a) => design.task.widths.map((w) => ({ a, w })));
          for (let j = pairs.length - 1; j > 0; j--) {
            const s = Math.floor(rng.uniform() * (j + 1));
            [pairs[j], pairs[s]] = [pairs[s]!, pairs[j]!];
          }
          const runs = [...(block === 1 ? [{ ...pairs[0]!, practice: true, sequence: 1 }] : []), ...pairs.map((p, s) => ({ ...p, practice: false, sequence: s + 1 }))];
          for (const run of runs) {
            const n = design.task.targetsPerRing;
            const ring = ringTargets(n, run.a / Math.cos(Math.PI / (2 * n)));
            const targets = ringVisitingOrder(n).map((t) => ring[t]!);
            const p = personFor(rng, condition.factorLevels, block, person);
            const sim = simulateSequence(
              { targets, amplitude: run.a, width: run.w, participant: code, condition: condition.label, block, sequence: run.sequence },
              config,
              { seed: p.seed, interceptMs: p.interceptMs, slopeMsPerBit: p.slopeMsPerBit, endpointSd: (run.w / 4.133) * p.spreadFactor, sensor: p.sensor, restMs: p.restMs, timingSdFraction: p.timingSdFraction },
            );
            const uploadKey = `seed-${code}-${k}-${block}-${run.sequence}${run.practice ? "-p" : ""}`;
            for (const t of sim.trials) {
              trialRows.push({
                participant_id: participantId, condition: condition.label, condition_index: k, block, sequence: run.sequence, trial: t.trial,
                practice: run.practice, unit: "px", amplitude: t.amplitude, width: t.width,
                from_x: t.from_x, from_y: t.from_y, to_x: t.to_x, to_y: t.to_y, start_x: t.start_x, start_y: t.start_y, end_x: t.end_x, end_y: t.end_y,
                time_ms: t.time_ms, hit: t.hit === 1, upload_key: uploadKey, received_at: new Date(started.getTime() + clock * 60_000),
              });
            }
            const last = sim.samples.at(-1)?.tMs ?? 0;
            streamRows.push({
              participant_id: participantId, upload_key: uploadKey, condition: condition.label, condition_index: k, block, sequence: run.sequence,
              practice: run.practice, sample_count: sim.samples.length, movement_count: sim.trials.length,
              stream_gz: gzipSync(formatSampleCsv(sim.samples.map(recorded)), { level: 1 }),
              quality: JSON.stringify({ sampleRateHz: last > 0 ? Math.round(((sim.samples.length - 1) * 1000 * 10) / last) / 10 : null, gaps: 0, dropped: 0 }),
              received_at: new Date(started.getTime() + clock * 60_000),
            });
          }
          clock += 3;
        }
        const effort = Math.max(1, Math.min(7, Math.round((condition.factorLevels.technique === "motion" ? 4.5 : 2.8) + (condition.factorLevels.gain === "high" ? 0.4 : 0) + rng.normal())));
        await trx("questionnaire_answers").insert({ participant_id: participantId, condition: condition.label, item_id: "effort", value_int: effort, answered_at: new Date(started.getTime() + (pos + 1) * 6 * 60_000) });
      }
      for (let b = 0; b < trialRows.length; b += 500) await trx("trials").insert(trialRows.slice(b, b + 500));
      for (let b = 0; b < streamRows.length; b += 12) await trx("sequence_streams").insert(streamRows.slice(b, b + 12));
      const finalAt = new Date(started.getTime() + 26 * 60_000);
      const final = [
        { item_id: "age_band", value_text: AGE_BANDS[i]! },
        { item_id: "handedness", value_text: HANDS[i]! },
        { item_id: "experience", value_int: 1 + Math.floor(rng.uniform() * 7) },
        ...(COMMENTS[i] ? [{ item_id: "comments", value_text: COMMENTS[i]! }] : []),
      ];
      await trx("questionnaire_answers").insert(final.map((a) => ({ participant_id: participantId, condition: "", answered_at: finalAt, ...a })));
    }
    await appendAudit(trx, { actorUserId: null, actorLabel: "system", action: "study.create", studyId, details: { title: FINISHED_STUDY.title, seeded: true, participants: 12 } });
  });
  return [`finished study "${FINISHED_STUDY.title}" with 12 simulated participants`];
}
