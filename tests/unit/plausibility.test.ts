import { gzipSync } from "node:zlib";
import { describe, expect, it } from "vitest";
import { INFLATE_CHUNK_BYTES, inspectGzipStream, StreamRefusal, streamByteCap } from "@/lib/ingest/inspectStream";
import type { TransferConfigInput } from "@/lib/motion/config";
import { formatSampleCsv } from "@/lib/motion/csv";
import { techniqueExamples } from "@/lib/motion/testing/techniqueExamples";
import { batchProblems, planSession, sequenceLayout, streamProblems, type Problem, type SequenceBatch } from "@/lib/runner";
import { answerProblems } from "@/lib/runner/questionnaire";
import { studyDesignSchema, type StudyDesign } from "@/lib/study/design";
import { genuineBatch, wire } from "../fixtures/genuineBatch";

// Every technique the simulated participant (lib/motion/simulate) can take through a ring task,
// the heading stick with motion for the vertical (alone it turns only horizontally).
const TECHNIQUES = techniqueExamples;

function designFor(config: TransferConfigInput, displayMode: "cursor" | "view", type: "ring" | "strip" = "ring"): StudyDesign {
  const view = displayMode === "view";
  return studyDesignSchema.parse({
    baseConfig: { ...config, ...(view ? {} : { pixelsPerDegree: 12 }) },
    factors: [{ name: "technique", levels: [{ label: "only", config: {} }] }],
    task: { type, displayMode, unit: view ? "deg-view" : "px", amplitudes: view ? [30] : [300], widths: view ? [4] : [40], targetsPerRing: 9, practiceSequences: 1 },
    counterbalancing: { method: "williams" },
  });
}

const rules = (ps: readonly Problem[]): string[] => [...new Set(ps.map((p) => p.rule))];

/** Every check the server makes of an upload: the movements, then the stream they came with. */
async function allProblems(batch: SequenceBatch, participantId: number, design: StudyDesign): Promise<Problem[]> {
  const plan = planSession(design, [0], 7);
  const first = batchProblems(batch, participantId, plan, design);
  if (first.length > 0) return first;
  const facts = await inspectGzipStream(Buffer.from(batch.stream.gzipBase64, "base64"), batch.stream.sampleCount);
  return streamProblems(batch, facts);
}

describe("upload plausibility: genuine data of every technique in both display modes passes", () => {
  for (const displayMode of ["cursor", "view"] as const) {
    for (const [name, config] of TECHNIQUES) {
      it(`${name}, ${displayMode} mode`, async () => {
        const design = designFor(config, displayMode);
        const plan = planSession(design, [0], 7);
        for (const planned of plan) {
          const batch = wire(genuineBatch(design, 12, planned));
          expect(await allProblems(batch, 12, design), `${name} ${displayMode} ${batch.key}`).toEqual([]);
        }
      });
    }
  }
  it("the heading stick alone on strips (it turns only horizontally), both modes", async () => {
    for (const displayMode of ["cursor", "view"] as const) {
      const design = designFor({ technique: "stick", stickMode: "heading" }, displayMode, "strip");
      for (const planned of planSession(design, [0], 7)) expect(await allProblems(wire(genuineBatch(design, 3, planned)), 3, design)).toEqual([]);
    }
  });
  it("a participant who misses, times out and slips twice in a row still passes", async () => {
    const design = designFor({ technique: "motion", gain: 3 }, "cursor");
    const planned = planSession(design, [0], 7)[1]!;
    const batch = wire(genuineBatch(design, 5, planned, { person: { endpointSd: 40 } }));
    expect(batch.movements.some((m) => m.hit === 0)).toBe(true);
    // a double press: one movement of 40 ms (the next selection at once), the median stays a person's
    const slipped = { ...batch, movements: batch.movements.map((m, i) => (i === 3 ? { ...m, time_ms: 40 } : m)) };
    expect(batchProblems(slipped, 5, planSession(design, [0], 7), design)).toEqual([]);
  });
});

describe("upload plausibility: made-up sequences are refused, naming the rule", () => {
  const design = designFor({ technique: "motion", frame: "adaptive", gain: 3 }, "cursor");
  const viewDesign = designFor({ technique: "motion", frame: "adaptive", gain: 3 }, "view");
  const plan = planSession(design, [0], 7);
  const planned = plan[1]!;
  const good = wire(genuineBatch(design, 12, planned));
  const check = (b: SequenceBatch, d = design) => rules(batchProblems(b, 12, planSession(d, [0], 7), d));
  const withMovements = (f: (m: SequenceBatch["movements"][number], i: number) => SequenceBatch["movements"][number]) => ({ ...good, movements: good.movements.map(f) });

  it("a fabricated batch: every end point on the target centre, 1 ms apart", () => {
    const made = withMovements((m) => ({ ...m, start_x: m.from_x, start_y: m.from_y, end_x: m.to_x, end_y: m.to_y, time_ms: 1, hit: 1 }));
    expect(check(made)).toContain("time");
  });
  it("targets that are not the plan's: moved, or in view mode laid out flat instead of on the sphere", () => {
    expect(check(withMovements((m) => ({ ...m, to_x: m.to_x + 5 })))).toContain("targets");
    const vPlanned = planSession(viewDesign, [0], 7)[1]!;
    const vb = wire(genuineBatch(viewDesign, 12, vPlanned));
    const flat = sequenceLayout("ring", 9, vPlanned.amplitude, vPlanned.width, "plane").order;
    const flattened = { ...vb, movements: vb.movements.map((m, i) => ({ ...m, from_x: flat[i]!.x, from_y: flat[i]!.y, to_x: flat[i + 1]!.x, to_y: flat[i + 1]!.y })) };
    expect(check(vb, viewDesign)).toEqual([]);
    expect(check(flattened, viewDesign)).toContain("targets");
  });
  it("a movement that does not start where the last one ended", () => {
    expect(check(withMovements((m, i) => (i === 4 ? { ...m, start_x: m.start_x + 3 } : m)))).toEqual(["start"]);
  });
  it("a hit claimed far outside the target, a miss claimed on its centre", () => {
    expect(check(withMovements((m, i) => (i === 2 ? { ...m, end_x: m.to_x + 200, hit: 1 } : i === 3 ? { ...m, start_x: m.start_x + 200 } : m)))).toContain("hit");
    const centre = withMovements((m, i) => (i === 6 ? { ...m, end_x: m.to_x, end_y: m.to_y, hit: 0 } : i === 7 ? { ...m, start_x: m.from_x, start_y: m.from_y } : m));
    expect(check(centre)).toEqual(["hit"]);
  });
  it("a hit on the view sphere is a great-circle angle: at a high pitch a yaw offset wider than W/2 can be inside", () => {
    const vPlan = planSession(viewDesign, [0], 7);
    const vb = wire(genuineBatch(viewDesign, 12, vPlan[1]!));
    const i = vb.movements.reduce((best, m, k) => (m.to_y > vb.movements[best]!.to_y ? k : best), 0);
    const phi = (vb.movements[i]!.to_y * Math.PI) / 180;
    // spherical law of cosines for two directions at the same pitch φ, yaw δ apart:
    // cos c = sin²φ + cos²φ·cos δ; choose δ so that c = 1.98° (inside W/2 = 2°)
    const c = (1.98 * Math.PI) / 180;
    const delta = (Math.acos((Math.cos(c) - Math.sin(phi) ** 2) / Math.cos(phi) ** 2) * 180) / Math.PI;
    expect(delta).toBeGreaterThan(2); // flat, this would be a miss
    const at = (hit: 0 | 1) => ({ ...vb, movements: vb.movements.map((m, k) => (k === i ? { ...m, end_x: m.to_x + delta, end_y: m.to_y, hit } : k === i + 1 ? { ...m, start_x: m.from_x + delta, start_y: m.from_y } : m)) });
    expect(rules(batchProblems(at(1), 12, vPlan, viewDesign))).toEqual([]);
    expect(rules(batchProblems(at(0), 12, vPlan, viewDesign))).toEqual(["hit"]);
  });
  it("a time of 0, beyond the limit, or a median faster than a person", () => {
    expect(check(withMovements((m, i) => (i === 0 ? { ...m, time_ms: 0 } : m)))).toEqual(["time"]);
    expect(check(withMovements((m) => ({ ...m, time_ms: design.task.trialTimeLimitMs + 1 })))).toEqual(["time"]);
    expect(check(withMovements((m) => ({ ...m, time_ms: 60 })))).toEqual(["time"]);
  });
  it("another session's key, a sequence not in the plan, a width that is not the plan's", () => {
    expect(rules(batchProblems(good, 13, plan, design))).toEqual(["key"]);
    expect(check({ ...good, sequence: 99 })).toEqual(["plan"]);
    expect(check({ ...good, width: good.width + 1 })).toEqual(["width"]);
    expect(check({ ...good, movements: good.movements.slice(1) })).toEqual(["movements"]);
  });

  const stream = (samples: { tMs: number }[]) => ({ gzipBase64: gzipSync(formatSampleCsv(samples.map((s) => ({ ...s, gyroX: 0, gyroY: 0, gyroZ: 0 })))).toString("base64"), sampleCount: samples.length });
  it("a stream much shorter than the movements", async () => {
    const short = { ...good, stream: stream(Array.from({ length: 10 }, (_, k) => ({ tMs: k * 16 }))), quality: { ...good.quality, sampleRateHz: 62.5 } };
    expect(rules(await allProblems(short, 12, design))).toEqual(["stream-span"]);
  });
  it("a declared rate that the samples do not have, and a sample count that is not the stream's", async () => {
    expect(rules(await allProblems({ ...good, quality: { ...good.quality, sampleRateHz: good.quality.sampleRateHz * 2 } }, 12, design))).toEqual(["sample-rate"]);
    const facts = await inspectGzipStream(Buffer.from(good.stream.gzipBase64, "base64"), good.stream.sampleCount + 5);
    expect(rules(streamProblems({ ...good, stream: { ...good.stream, sampleCount: good.stream.sampleCount + 5 } }, facts))).toContain("samples");
  });
});

describe("decompression: a stream, with a cap from the declared sample count", () => {
  const header = "t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle\n";
  it("a gzip bomb (a few KB that inflate to 16 MB) stops within one chunk of the cap", async () => {
    const line = "0,0,0,0,,,,,,,0\n";
    const bomb = gzipSync(Buffer.from(header + line.repeat(Math.ceil((16 * 1024 * 1024) / line.length))), { level: 9 });
    expect(bomb.length).toBeLessThan(64 * 1024);
    const refusal = await inspectGzipStream(bomb, 600).then(() => null, (e: unknown) => e);
    expect(refusal).toBeInstanceOf(StreamRefusal);
    expect((refusal as StreamRefusal).inflatedBytes).toBeLessThanOrEqual(streamByteCap(600) + INFLATE_CHUNK_BYTES);
  });
  it("one endless line stops at the longest a sample can be", async () => {
    const bomb = gzipSync(Buffer.concat([Buffer.from(header), Buffer.alloc(8 * 1024 * 1024, 0x31)]), { level: 9 });
    const refusal = (await inspectGzipStream(bomb, 200_000).catch((e: unknown) => e)) as StreamRefusal;
    expect(refusal.message).toMatch(/line longer/);
    expect(refusal.inflatedBytes).toBeLessThanOrEqual(2 * INFLATE_CHUNK_BYTES);
  });
  it("refuses what is not gzip, a corrupt member and a header of other columns", async () => {
    await expect(inspectGzipStream(Buffer.from("t_ms,gyro_x\n0,1\n".repeat(3)), 3)).rejects.toThrow("not gzip");
    const gz = gzipSync(header + "0,0,0,0,,,,,,,0\n");
    gz[gz.length - 6]! ^= 0xff; // the CRC-32 (RFC 1952 §2.3.1) no longer matches
    await expect(inspectGzipStream(gz, 1)).rejects.toThrow(/cannot be decompressed/);
    await expect(inspectGzipStream(gzipSync("t_ms,gyro_x,gyro_y,gyro_z,email\n0,0,0,0,x\n"), 1)).rejects.toThrow(/header/);
  });
  it("reads the count and the times of a genuine stream", async () => {
    const facts = await inspectGzipStream(gzipSync(header + "5,0,0,0,,,,,,,0\n3,0,0,0,,,,,,,0\n9.5,0,0,0,,,,,,,0\n"), 3);
    expect(facts).toEqual({ samples: 3, firstMs: 5, lastMs: 9.5, minMs: 3, maxMs: 9.5 });
  });
});

describe("questionnaire answers: only the design's items, within their scale", () => {
  const design = studyDesignSchema.parse({
    factors: [{ name: "technique", levels: [{ label: "motion", config: {} }, { label: "stick", config: { technique: "stick" } }] }],
    task: { amplitudes: [300], widths: [30] },
    counterbalancing: { method: "williams" },
    perConditionItems: [{ id: "effort", text: "How much effort?", points: 7, lowLabel: "little", highLabel: "much" }],
    finalQuestionnaire: { ageBand: true, handedness: true, experience: false, comments: true },
  });
  const one = (condition: string, itemId: string, valueInt: number | null, valueText: string | null) => rules(answerProblems(design, { condition, answers: [{ itemId, valueInt, valueText }] }));
  it("accepts what the runner sends", () => {
    expect(one("motion", "effort", 7, null)).toEqual([]);
    expect(answerProblems(design, { condition: "", answers: [{ itemId: "age_band", valueInt: null, valueText: "25–34" }, { itemId: "handedness", valueInt: null, valueText: "left" }, { itemId: "comments", valueInt: null, valueText: "=1+1" }] })).toEqual([]);
    expect(one("", "none", null, null)).toEqual([]);
  });
  it("refuses items not in the design, values off the scale, and questions the study does not ask", () => {
    expect(one("motion", "mood", 3, null)).toEqual(["questionnaire"]);
    expect(one("motion", "effort", 8, null)).toEqual(["questionnaire"]);
    expect(one("motion", "effort", 0, null)).toEqual(["questionnaire"]);
    expect(one("motion", "effort", 4, "and a note")).toEqual(["questionnaire"]);
    expect(one("nowhere", "effort", 4, null)).toEqual(["questionnaire"]);
    expect(one("", "experience", null, "often")).toEqual(["questionnaire"]);
    expect(one("", "age_band", null, "31")).toEqual(["questionnaire"]);
    expect(one("", "email", null, "someone@example.org")).toEqual(["questionnaire"]);
    expect(rules(answerProblems(design, { condition: "motion", answers: [{ itemId: "effort", valueInt: 2, valueText: null }, { itemId: "effort", valueInt: 3, valueText: null }] }))).toEqual(["questionnaire"]);
  });
});
