import { describe, expect, it } from "vitest";
import { PerspectiveCamera, Vector3, MathUtils } from "three";
import { ringAmplitude } from "@/lib/task";
import { simulateSequence } from "@/lib/motion/simulate";
import { estimateBiasAtRest } from "@/lib/motion/calibration";
import { studyDesignSchema, conditionsOf } from "@/lib/study/design";
import {
  BLIND_SPOT_ANGLE_DEG, ID1_CARD_WIDTH_MM, advanceProgress, batchProblems, consentBlocks, createSequenceRecorder, currentStep,
  deviceVerdict, initialProgress, isInsideTarget, pixelsPerMmFromCard, pixelsPerTaskUnit, planSession, projectDirection, qualityFlags,
  requiredStatementIds, retryDelayMs, selectButtonFor, sequenceBatchSchema, sequenceLayout, uploadKey, uploadOutcome, viewingDistanceFromBlindSpot,
  visualDegreesToPixels, type Progress, type SequenceBatch,
} from "@/lib/runner";

const EPS = 1e-9;
const design = studyDesignSchema.parse({
  factors: [{ name: "gain", levels: [{ label: "g2", config: { gain: 2 } }, { label: "g4", config: { gain: 4 } }, { label: "g6", config: { gain: 6 } }] }],
  task: { amplitudes: [300, 200], widths: [30, 60], targetsPerRing: 13, practiceSequences: 1 },
  blocks: 2,
  minBreakSeconds: 10,
  perConditionItems: [{ id: "effort", text: "How hard?", lowLabel: "easy", highLabel: "hard" }],
  counterbalancing: { method: "williams", seed: 5 },
});

describe("calibration (outside references)", () => {
  it("card: px/mm = width / 85.60 (ID-1 card, ISO/IEC 7810: 85.60 × 53.98 mm)", () => {
    expect(ID1_CARD_WIDTH_MM).toBe(85.6);
    expect(pixelsPerMmFromCard(85.6 * 3.78)).toBeCloseTo(3.78, 12);
    expect(() => pixelsPerMmFromCard(0)).toThrow("pixelsPerMmFromCard requires a positive card width in px");
  });
  it("blind spot: d = s / tan(13.5°) (Li et al. 2020, Scientific Reports 10:904)", () => {
    expect(BLIND_SPOT_ANGLE_DEG).toBe(13.5);
    // a viewer at 500 mm has the blind spot 500·tan 13.5° = 120.04 mm from fixation
    const s = 500 * Math.tan((13.5 * Math.PI) / 180);
    expect(s).toBeCloseTo(120.04, 2);
    expect(viewingDistanceFromBlindSpot([s * 4 - 2, s * 4 + 2], 4)).toBeCloseTo(500, 9);
  });
  it("visual angle: 1° at 57.3 cm is 1 cm (common practice, from memory), 2·d·tan(θ/2)", () => {
    expect(visualDegreesToPixels(1, 572.96, 1)).toBeCloseTo(10, 3);
    expect(pixelsPerTaskUnit("deg-visual", 10, { pixelsPerMm: 4, viewingDistanceMm: 600 }) * 10).toBeCloseTo(visualDegreesToPixels(10, 600, 4), 9);
    expect(() => pixelsPerTaskUnit("mm", 10, { pixelsPerMm: null, viewingDistanceMm: null })).toThrow("card calibration");
  });
});

describe("view-mode projection agrees with three.js PerspectiveCamera", () => {
  it.each([[0, 0, 0, 0], [10, 5, 0, 0], [30, -10, 20, 5], [-45, 20, -30, 10]])("target (%d, %d) seen from (%d, %d)", (ty, tp, vy, vp) => {
    const w = 800, h = 600, fov = 60;
    const out = { x: 0, y: 0 };
    expect(projectDirection(ty, tp, vy, vp, fov, w, h, out)).toBe(true);
    const camera = new PerspectiveCamera(fov, w / h, 0.1, 100);
    // three.js looks down −z; yaw to the right is a negative rotation about y
    camera.rotation.order = "YXZ";
    camera.rotation.set(MathUtils.degToRad(vp), -MathUtils.degToRad(vy), 0);
    camera.updateMatrixWorld();
    const r = Math.PI / 180;
    const d = new Vector3(Math.cos(tp * r) * Math.sin(ty * r), Math.sin(tp * r), -Math.cos(tp * r) * Math.cos(ty * r)).multiplyScalar(10);
    const ndc = d.project(camera);
    expect(out.x).toBeCloseTo(((ndc.x + 1) / 2) * w, 6);
    expect(out.y).toBeCloseTo(((1 - ndc.y) / 2) * h, 6);
  });
  it("a direction behind the camera is not drawn", () => {
    expect(projectDirection(180, 0, 0, 0, 60, 800, 600, { x: 0, y: 0 })).toBe(false);
  });
});

describe("task layout (ISO 9241-411, science.md §1)", () => {
  it("ring: every hop is the nominal chord A, visiting order k(n+1)/2 mod n", () => {
    const l = sequenceLayout("ring", 13, 300, 30);
    expect(l.order).toHaveLength(14);
    const d = 300 / Math.cos(Math.PI / 26);
    expect(ringAmplitude(13, d)).toBeCloseTo(300, 9); // lib/task's chord formula A = D·cos(π/(2n))
    for (let i = 1; i < l.order.length; i++) expect(Math.hypot(l.order[i]!.x - l.order[i - 1]!.x, l.order[i]!.y - l.order[i - 1]!.y)).toBeCloseTo(300, 9);
    expect(l.order[1]).toEqual(l.all[7]); // n = 13: 0, 7, 1, 8, ...
  });
  it("strip: alternates between two strips A apart; hit is within W/2 along the axis", () => {
    const l = sequenceLayout("strip", 5, 200, 40);
    expect(l.order.map((p) => p.x)).toEqual([-100, 100, -100, 100, -100, 100]);
    expect(isInsideTarget("strip", { x: 100, y: 0 }, l.axis, { x: 119, y: 500 }, 40)).toBe(true);
    expect(isInsideTarget("strip", { x: 100, y: 0 }, l.axis, { x: 121, y: 0 }, 40)).toBe(false);
  });
});

describe("sequence recorder", () => {
  it("reproduces the simulated participant's trial rows from its selections", () => {
    const layout = sequenceLayout("ring", 13, 300, 30);
    const sim = simulateSequence({ targets: layout.order, amplitude: 300, width: 30 }, { displayMode: "cursor", gain: 3 }, { seed: 11 });
    const r = createSequenceRecorder(layout, 10_000);
    for (const s of sim.selections) r.select(s.tMs, { x: s.x, y: s.y });
    expect(r.finished).toBe(true);
    expect(r.movements).toHaveLength(13);
    r.movements.forEach((m, i) => {
      const t = sim.trials[i]!;
      expect(m.trial).toBe(t.trial);
      expect(m.time_ms).toBeCloseTo(t.time_ms, 6);
      expect(m.end_x).toBeCloseTo(t.end_x, EPS);
      expect(m.start_y).toBeCloseTo(t.start_y, EPS);
      expect(m.hit).toBe(t.hit);
    });
    expect(() => r.select(1e9, { x: 0, y: 0 })).toThrow("select: the sequence is finished");
  });
  it("flags a movement that timed out, or during which a recenter or the clutch happened (interfaces.md optional columns)", () => {
    const r = createSequenceRecorder(sequenceLayout("ring", 5, 100, 10), 2000);
    r.noteRecenter(); // before the first selection: no movement runs yet
    r.noteClutch();
    r.select(0, { x: 0, y: 0 });
    const first = r.select(500, { x: 0, y: 0 })!;
    expect([first.timed_out, first.recentered, first.clutched]).toEqual([0, 0, 0]);
    r.noteRecenter();
    const second = r.select(900, { x: 0, y: 0 })!;
    expect([second.timed_out, second.recentered, second.clutched]).toEqual([0, 1, 0]);
    r.noteClutch();
    const third = r.select(2900, { x: 0, y: 0 }, { timedOut: true })!;
    expect([third.timed_out, third.recentered, third.clutched, third.time_ms]).toEqual([1, 0, 1, 2000]);
    expect([r.select(3500, { x: 0, y: 0 })!.clutched]).toEqual([0]);
  });
  it("clamps a movement at the trial time limit and refuses time going backwards", () => {
    const r = createSequenceRecorder(sequenceLayout("ring", 5, 100, 10), 2000);
    r.select(1000, { x: 0, y: 0 });
    expect(r.timeoutAt()).toBe(3000);
    expect(r.select(3000, { x: 0, y: 0 })?.time_ms).toBe(2000);
    expect(() => r.select(10, { x: 0, y: 0 })).toThrow("select: time went backwards");
  });
});

describe("session plan and step machine", () => {
  const order = [2, 0, 1];
  const plan = planSession(design, order, 42);
  it("has practice once per condition (block 1) and every A×W once per condition and block", () => {
    expect(plan.filter((s) => s.practice)).toHaveLength(3);
    expect(plan.filter((s) => !s.practice)).toHaveLength(2 * 3 * 4);
    expect(plan[0]!.conditionIndex).toBe(2);
    for (const b of [1, 2]) for (const c of [0, 1, 2]) {
      const pairs = plan.filter((s) => !s.practice && s.block === b && s.conditionIndex === c).map((s) => `${s.amplitude}x${s.width}`).sort();
      expect(pairs).toEqual(["200x30", "200x60", "300x30", "300x60"]);
    }
    expect(planSession(design, order, 42)).toEqual(plan);
    expect(() => planSession(design, [0, 0, 1], 1)).toThrow("permutation");
  });
  it("walks info → … → complete with breaks at condition changes and the questionnaire after a condition's last sequence", () => {
    let p: Progress = initialProgress();
    const kinds: string[] = [];
    for (let i = 0; i < 500 && currentStep(p, plan, design).kind !== "complete"; i++) {
      const s = currentStep(p, plan, design);
      kinds.push(s.kind === "condition-questionnaire" ? `q:${s.condition}` : s.kind);
      p = advanceProgress(p, plan, design);
    }
    expect(kinds.slice(0, 5)).toEqual(["info", "consent", "device", "calibration", "instructions"]);
    expect(kinds.filter((k) => k === "sequence")).toHaveLength(plan.length);
    expect(kinds.filter((k) => k === "break")).toHaveLength(5); // 6 condition runs, a break before each but the first
    expect(kinds.filter((k) => k.startsWith("q:"))).toEqual(conditionsOf(design).map((_, i) => `q:${conditionsOf(design)[order[i]!]!.label}`));
    expect(kinds.at(-1)).toBe("final");
    expect(() => advanceProgress(p, plan, design)).toThrow("advanceProgress: nothing follows completion");
  });
  it("resumes at the next unfinished sequence", () => {
    expect(currentStep({ stage: "task", done: 2, answered: [], breaks: [] }, plan, design)).toEqual({ kind: "sequence", index: 2 });
    expect(currentStep({ stage: "task", done: 5, answered: [], breaks: [] }, plan, design)).toEqual({ kind: "break", index: 5, seconds: 10 });
  });
});

describe("upload contract", () => {
  const plan = planSession(design, [0, 1, 2], 1);
  const s = plan[1]!;
  const layout = sequenceLayout("ring", 13, s.amplitude, s.width);
  const good: SequenceBatch = {
    key: uploadKey(9, s), practice: s.practice, block: s.block, conditionIndex: s.conditionIndex, condition: s.condition, sequence: s.sequence,
    unit: "px", amplitude: s.amplitude, width: s.width,
    movements: layout.order.slice(1).map((to, i) => ({ trial: i + 1, from_x: layout.order[i]!.x, from_y: layout.order[i]!.y, to_x: to.x, to_y: to.y, start_x: i === 0 ? 0 : layout.order[i]!.x, start_y: i === 0 ? 0 : layout.order[i]!.y, end_x: to.x, end_y: to.y, time_ms: 650, hit: 1, timed_out: 0, recentered: 0, clutched: 0 })),
    stream: { gzipBase64: "H4sI", sampleCount: 10 },
    quality: { sampleRateHz: 60, jitterSdMs: 1, gaps: 0, droppedSamples: 0, frameP99Ms: null },
  };
  it("an upload from a page without the flags stores them as 0", () => {
    const { timed_out: _t, recentered: _r, clutched: _c, ...old } = good.movements[0]!;
    expect(sequenceBatchSchema.parse({ ...good, movements: [old] }).movements[0]).toMatchObject({ timed_out: 0, recentered: 0, clutched: 0 });
  });
  it("keys are unique per session and sequence", () => {
    expect(uploadKey(9, s)).toBe(`9:m:1:0:1`);
    expect(new Set(plan.map((x) => uploadKey(9, x))).size).toBe(plan.length);
  });
  it("a well-formed batch has no problems; each implausible change is named", () => {
    expect(batchProblems(good, 9, plan, design)).toEqual([]);
    const first = (b: SequenceBatch, pid = 9) => batchProblems(b, pid, plan, design)[0]?.message;
    expect(first({ ...good, key: uploadKey(8, s) })).toMatch(/key must be/);
    expect(first({ ...good, width: 99 })).toMatch(/width must be/);
    expect(first({ ...good, movements: good.movements.slice(2) })).toMatch(/13 movements/);
    expect(first({ ...good, movements: good.movements.map((m) => ({ ...m, time_ms: 20_000 })) })).toMatch(/time_ms/);
    expect(batchProblems({ ...good, movements: good.movements.map((m) => ({ ...m, to_x: m.to_x + 5 })) }, 9, plan, design).length).toBeGreaterThan(0);
    expect(first({ ...good, sequence: 99 })).toMatch(/not in this session's plan/);
  });
  it("queue decisions follow RFC 9110 status classes; backoff doubles to a cap", () => {
    expect(uploadOutcome(201)).toBe("stored");
    expect(uploadOutcome(200)).toBe("stored");
    expect(uploadOutcome(422)).toBe("refused");
    expect(uploadOutcome(410)).toBe("stop");
    expect(uploadOutcome(0)).toBe("retry");
    expect(uploadOutcome(503)).toBe("retry");
    expect([0, 1, 2, 3, 10].map((a) => retryDelayMs(a, 1))).toEqual([1000, 2000, 4000, 8000, 30000]);
    expect(retryDelayMs(3, 0)).toBe(4000);
  });
});

describe("device check, calibration at rest, consent text, monitor flags", () => {
  it("refuses a motion study below its minimum sensor rate, with a message", () => {
    const base = { motion: true, gamepad: false, touch: true, finePointer: false };
    const v = deviceVerdict(["motion"], { ...base, sampleRateHz: 30 }, 50);
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.message).toContain("at least 50 times per second");
    expect(deviceVerdict(["motion"], { ...base, sampleRateHz: 60 }, 50).ok).toBe(true);
    expect(deviceVerdict(["stick"], { ...base, sampleRateHz: null }, 50).ok).toBe(false);
    expect(deviceVerdict(["touch"], { ...base, sampleRateHz: null }, 50).ok).toBe(true);
  });
  it("bias at rest is recovered from a still phone stream in W3C DeviceMotion units (rotationRate, deg/s)", () => {
    // the simulated phone: ≈ 60 Hz, rates coarsened to 0.1 deg/s, bias (0.3, −0.2, 0.15) deg/s
    const still = simulateSequence({ targets: [{ x: 0, y: 0 }, { x: 100, y: 0 }], amplitude: 100, width: 10 }, { displayMode: "cursor" }, { seed: 3, sensor: "phone", restMs: 3000, selectButton: null });
    const b = estimateBiasAtRest(still.samples.filter((s) => s.tMs < 2900));
    expect(b.biasXDegPerS).toBeCloseTo(0.3, 1);
    expect(b.biasYDegPerS).toBeCloseTo(-0.2, 1);
  });
  it("consent: task-list items are the required statements; a document without any gets one", () => {
    const body = "# Title\n\nSome text\nmore text.\n\n- a point\n- [ ] I agree\n- [ ] I may stop";
    expect(consentBlocks(body).map((b) => b.kind)).toEqual(["heading", "paragraph", "item", "statement", "statement"]);
    expect(requiredStatementIds(body)).toEqual(["s1", "s2"]);
    expect(requiredStatementIds("Plain text only.")).toEqual(["s1"]);
  });
  it("monitor flags speak in words", () => {
    expect(qualityFlags({ status: "in_progress", sampleRateHz: 30, minSampleRateHz: 50, biasDegPerS: 2, errorRate: 0.3, lastActivityMs: 0, nowMs: 10 * 60_000 })).toEqual([
      "sensor rate 30 Hz, below 50 Hz", "large gyroscope bias 2.00 deg/s", "error rate 30 %, above 20 %", "idle for 10 min",
    ]);
    expect(qualityFlags({ status: "completed", sampleRateHz: 60, minSampleRateHz: 50, biasDegPerS: 0.1, errorRate: 0.04, lastActivityMs: 0, nowMs: 1e9 })).toEqual([]);
  });
  it("the select button is the lowest one the controls leave free (W3C Gamepad standard mapping)", () => {
    expect(selectButtonFor({ clutchButton: 0, aimButton: 1, recenterButton: 2 })).toBe(3);
    expect(selectButtonFor({ clutchButton: null, aimButton: null, recenterButton: 4 })).toBe(0);
  });
});
