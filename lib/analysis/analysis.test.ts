import fc from "fast-check";
import { mean } from "simple-statistics";
import { describe, expect, test } from "vitest";
import { generateTrialRows } from "../../experiments/generate";
import type { TrialRow } from "../trials";
import { analysisOptionsSchema } from "./options";
import { TrialTableError } from "../trials";
import {
  analyzeLegacyTrials,
  analyzeTrials,
  EFFECTIVE_WIDTH_FACTOR,
  buildResult,
  isMisfire,
  movementKey,
  pathAccuracy,
  projectMovement,
  TrialAccumulator,
  widthFromErrorRate,
} from "./index";

const small = () => [...generateTrialRows({ participants: 5, gains: [4, 6], amplitudes: [128, 256], widths: [16, 32], targetsPerRing: 9, seed: 3 })];

describe("constants and formulas", () => {
  test("4.133 = √(2πe) to 4 digits (ISO 9241-9 Annex B; information theory: entropy of a normal)", () => {
    expect(EFFECTIVE_WIDTH_FACTOR.toPrecision(4)).toBe(Math.sqrt(2 * Math.PI * Math.E).toPrecision(4));
  });
  test("width from error rate: MacKenzie 1992 table (from memory): 4 % → 1.006 W, 1 % → 0.802 W, 10 % → 1.256 W", () => {
    expect(widthFromErrorRate(1, 0.04)).toBeCloseTo(1.006, 3);
    expect(widthFromErrorRate(1, 0.01)).toBeCloseTo(0.802, 3);
    expect(widthFromErrorRate(1, 0.1)).toBeCloseTo(1.256, 3);
    // Below 0.0049 % (a percentage) the fixed factor 0.5089 applies (MacKenzie 1992, from memory).
    expect(widthFromErrorRate(10, 0.00004)).toBeCloseTo(5.089, 9);
  });
  test("dx equals the law-of-cosines form (c² − b² − a²)/(2a) (common practice, ISO 9241-411 practice)", () => {
    fc.assert(
      fc.property(fc.double({ min: -500, max: 500, noNaN: true }), fc.double({ min: -500, max: 500, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), (sx, sy, ex, ey) => {
        const t = { x: 300, y: 120 };
        if (Math.hypot(t.x - sx, t.y - sy) < 1) return;
        const p = { x: t.x + ex, y: t.y + ey };
        const m = projectMovement(sx, sy, t.x, t.y, p.x, p.y);
        const a = Math.hypot(t.x - sx, t.y - sy);
        const b = Math.hypot(p.x - t.x, p.y - t.y);
        const c = Math.hypot(p.x - sx, p.y - sy);
        expect(m.dx).toBeCloseTo((c * c - b * b - a * a) / (2 * a), 6);
      }),
    );
  });
  test("misfire rule (common practice): shorter than A/2 or further than 2W", () => {
    expect(isMisfire(100, 5, 256, 32)).toBe(true);
    expect(isMisfire(250, 70, 256, 32)).toBe(true);
    expect(isMisfire(250, 10, 256, 32)).toBe(false);
  });
});

describe("one sequence worked by hand", () => {
  // Three movements along +x from (0,0) to (100,0), W = 10, nominal start; end points overshoot by
  // 2, −2 and 3 (dx), times 400, 500, 600 ms. By hand: Ae = 101; SDx = sd(2, −2, 3) = 2.6458;
  // We = 4.133·2.6458 = 10.935; IDe = log2(101/10.935 + 1) = log2(10.2364) = 3.3556; MT = 500; TP = 6.711 bits/s.
  const base = { participant: "P1", condition: "A", block: 1, sequence: 1, amplitude: 100, width: 10, factors: {}, fromX: 0, fromY: 0, toX: 100, toY: 0, startX: 0, startY: 0, endY: 1 };
  const rows: TrialRow[] = [
    { ...base, trial: 1, endX: 102, timeMs: 400, hit: true },
    { ...base, trial: 2, endX: 98, timeMs: 500, hit: true },
    { ...base, trial: 3, endX: 103, timeMs: 600, hit: false },
  ];
  test("Ae, SDx, We, IDe, MT, TP, error rate", () => {
    const [s] = analyzeTrials(rows, { start: "nominal" }).sequences;
    expect(s!.ae).toBeCloseTo(101, 9);
    expect(s!.sdx).toBeCloseTo(2.6458, 4);
    expect(s!.we).toBeCloseTo(10.935, 3);
    expect(s!.ide).toBeCloseTo(3.3556, 3);
    expect(s!.mt).toBe(500);
    expect(s!.tp).toBeCloseTo(6.711, 2);
    expect(s!.errorRate).toBeCloseTo(1 / 3, 12);
  });
  test("a sequence of one movement is bad input", () => {
    expect(() => analyzeTrials([{ ...rows[0]!, line: 7 }], { file: "x.csv" })).toThrow(TrialTableError);
    expect(() => analyzeTrials([{ ...rows[0]!, line: 7 }], { file: "x.csv" })).toThrow(/^x\.csv:7:sequence: /);
  });
  test("misfires are removed and counted; misses stay", () => {
    const r = analyzeTrials([...rows, { ...base, trial: 4, endX: 20, timeMs: 300, hit: false }], { start: "nominal" });
    expect(r.excluded).toBe(1);
    expect(r.sequences[0]!.n).toBe(3);
    expect(analyzeTrials([...rows, { ...base, trial: 4, endX: 20, timeMs: 300, hit: false }], { exclude: "none" }).excluded).toBe(0);
  });
});

describe("properties of the pipeline", () => {
  const rows = small();
  const ref = analyzeTrials(rows);
  test("TP is invariant to translating, rotating and scaling all coordinates (with A and W)", () => {
    fc.assert(
      fc.property(fc.double({ min: -1000, max: 1000, noNaN: true }), fc.double({ min: -1000, max: 1000, noNaN: true }), fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }), (tx, ty, angle, scale) => {
        const c = Math.cos(angle), s = Math.sin(angle);
        const f = (x: number, y: number) => ({ x: scale * (c * x - s * y) + tx, y: scale * (s * x + c * y) + ty });
        const moved = rows.map((r) => {
          const from = f(r.fromX, r.fromY), to = f(r.toX, r.toY), st = f(r.startX, r.startY), end = f(r.endX, r.endY);
          return { ...r, amplitude: r.amplitude * scale, width: r.width * scale, fromX: from.x, fromY: from.y, toX: to.x, toY: to.y, startX: st.x, startY: st.y, endX: end.x, endY: end.y };
        });
        const out = analyzeTrials(moved);
        expect(out.excluded).toBe(ref.excluded);
        out.sequences.forEach((q, i) => expect(q.tp).toBeCloseTo(ref.sequences[i]!.tp, 6));
      }),
      { numRuns: 20 },
    );
  });
  test("the order of rows does not matter", () => {
    fc.assert(
      fc.property(fc.shuffledSubarray(rows.map((_, i) => i), { minLength: rows.length, maxLength: rows.length }), (perm) => {
        const out = analyzeTrials(perm.map((i) => rows[i]!));
        out.conditions.forEach((c, i) => expect(c.tp.mean).toBeCloseTo(ref.conditions[i]!.tp.mean!, 9));
        out.anova.forEach((a, i) => expect(a.F).toBeCloseTo(ref.anova[i]!.F!, 6));
      }),
      { numRuns: 10 },
    );
  });
  test("duplicating every participant leaves the condition means unchanged", () => {
    const twice = [...rows, ...rows.map((r) => ({ ...r, participant: r.participant + "b" }))];
    const out = analyzeTrials(twice);
    expect(out.cells).toHaveLength(2 * ref.cells.length);
    out.conditions.forEach((c, i) => {
      expect(c.tp.mean).toBeCloseTo(ref.conditions[i]!.tp.mean!, 9);
      expect(c.mt.mean).toBeCloseTo(ref.conditions[i]!.mt.mean!, 9);
      expect(c.n).toBe(2 * ref.conditions[i]!.n);
    });
  });
  test("Fitts regression runs over the A×W means pooled over participants (values against R's lm: lib/stats/rReference.test.ts)", () => {
    for (const reg of ref.regression) {
      // 2 amplitudes × 2 widths = 4 points; a steeper MT for harder ID makes the slope positive (simulated b > 0).
      expect(reg.points).toBe(4);
      expect(reg.slope!).toBeGreaterThan(0);
      expect(reg.note).toBeNull();
    }
  });
  test("the simulator's built-in We ≈ W is recovered (pipeline consistency, not an outside reference)", () => {
    const many = analyzeTrials(generateTrialRows({ participants: 10, gains: [4], amplitudes: [256], widths: [32], seed: 11, slipRate: 0 }), { start: "nominal" });
    // End points drawn with σ = W/4.133 along the axis, so mean We should be near W = 32.
    expect(mean(many.sequences.map((s) => s.we))).toBeGreaterThan(28);
    expect(mean(many.sequences.map((s) => s.we))).toBeLessThan(36);
  });
  test("two halves merged equal the whole (TrialAccumulator.merge, as the worker threads use it)", () => {
    const opts = analysisOptionsSchema.parse({ file: "x" });
    const whole = new TrialAccumulator(opts), a = new TrialAccumulator(opts), b = new TrialAccumulator(opts);
    rows.forEach((r, i) => { whole.add(r); (i < rows.length / 2 ? a : b).add(r); });
    a.merge(b);
    const one = buildResult(whole, opts), two = buildResult(a, opts);
    expect(two.sequences).toEqual(one.sequences);
    expect(two.anova).toEqual(one.anova);
  });
});

describe("aggregation details", () => {
  test("a participant lacking a condition is reported and left out of the ANOVA", () => {
    const rows = small().filter((r) => !(r.participant === "P02" && r.condition === "stick-6"));
    const r = analyzeTrials(rows);
    expect(r.missing.participantsExcluded).toBe(1);
    expect(r.missing.cells).toEqual([{ participant: "P02", condition: "stick-6" }]);
    expect(r.anova[0]!.df2).toBe(3 * (4 - 1));
  });
  test("factorial rows for f_ factors, named in the order of their columns (interfaces.md: technique:gain)", () => {
    // The simulator's rows list technique before gain, as the columns would.
    const r = analyzeTrials(small());
    expect(r.anova.map((a) => a.effect)).toEqual(["condition", "technique", "gain", "technique:gain"]);
    // With the header's order given (f_gain before f_technique), the names follow it.
    expect(analyzeTrials(small(), {}, undefined, ["gain", "technique"]).anova.map((a) => a.effect)).toEqual(["condition", "gain", "technique", "gain:technique"]);
  });
  test("legacy tables: We from the error rate, flagged (MacKenzie 1992 table, from memory: 4 % → 1.006 W)", () => {
    // One sequence of 25 movements with one miss: E = 4 %, so We = 1.006·W = 32.19 for W = 32.
    const base = { participant: "P1", condition: "A", block: 1, sequence: 1, amplitude: 256, width: 32, timeMs: 600, factors: {} };
    const rows = Array.from({ length: 25 }, (_, i) => ({ ...base, trial: i + 1, hit: i !== 7 }));
    const r = analyzeLegacyTrials(rows);
    expect(r.widthMethod).toBe("errorRate");
    expect(r.notes[0]).toMatch(/error rates/);
    expect(r.sequences[0]!.errorRate).toBeCloseTo(0.04, 12);
    expect(r.sequences[0]!.we).toBeCloseTo(1.006 * 32, 1);
    expect(r.sequences[0]!.ae).toBe(256);
  });
});

describe("path accuracy", () => {
  const from = { x: 0, y: 0 }, to = { x: 100, y: 0 };
  test("worked case: a single bump (definitions of MacKenzie, Kauppinen & Silfverberg 2001, from memory)", () => {
    const m = pathAccuracy([{ x: 0, y: 0 }, { x: 50, y: 5 }, { x: 100, y: 0 }], from, to, 20);
    // By hand: y = 0, 5, 0 → MO = ME = 5/3; MV = sd(0, 5, 0) = 2.8868; one change of Δy sign.
    expect(m.mo).toBeCloseTo(5 / 3, 12);
    expect(m.me).toBeCloseTo(5 / 3, 12);
    expect(m.mv).toBeCloseTo(2.8868, 4);
    expect(m).toMatchObject({ mdc: 1, tac: 0, odc: 0, tre: 0 });
  });
  test("crossings and re-entry count; noise inside the band does not", () => {
    const wiggle = [0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100, 112, 100].map((x, i) => ({ x, y: i < 10 ? (i % 2 ? 3 : -3) : 0 }));
    const m = pathAccuracy(wiggle, from, to, 10, { hysteresis: 1 });
    // y alternates −3, +3 over ten samples: nine sign changes beyond ±1.
    expect(m.tac).toBe(9);
    expect(m.tre).toBe(1);
    expect(m.odc).toBe(1);
    // A band of 7 exceeds both the ±3 offsets and the 6-unit swings, so neither counts.
    const quiet = pathAccuracy(wiggle, from, to, 10, { hysteresis: 7 });
    expect(quiet.tac).toBe(0);
    expect(quiet.mdc).toBe(0);
  });
  test("per sequence and per condition means through analyzeTrials with path measures", () => {
    const rows = small().slice(0, 9);
    const measures = new Map(rows.map((r, i) => [movementKey(r.participant, r.condition, r.block, r.sequence, r.trial), { tre: i % 2, tac: 1, mdc: 2, odc: 0, mv: 1.5, me: 2, mo: -1 }]));
    const out = analyzeTrials(rows, {}, measures);
    const s = out.sequences[0]!;
    expect(s.path?.movements).toBe(s.n);
    expect(out.pathMovements?.length).toBe(s.n);
    expect(s.path?.mdc).toBe(2);
    expect(out.conditions[0]!.path).toMatchObject({ tac: 1, mv: 1.5, mo: -1, participants: 1 });
  });
  test("strip targets: re-entry counts only the distance along the axis (a strip is long across it)", () => {
    // The path passes the target centre's line 30 units off the axis: outside a circle of W = 20,
    // inside a strip of W = 20; it enters, leaves by 15 and comes back.
    const path = [0, 50, 100, 115, 100].map((x) => ({ x, y: 30 }));
    expect(pathAccuracy(path, from, to, 20, { task: "ring", hysteresis: 1 }).tre).toBe(0);
    expect(pathAccuracy(path, from, to, 20, { task: "strip", hysteresis: 1 }).tre).toBe(1);
  });
});

describe("exclusion rules and flags", () => {
  const base = { participant: "P1", condition: "A", block: 1, fromX: 0, fromY: 0, toX: 100, toY: 0, startX: 0, startY: 0, endY: 0, amplitude: 100, width: 10, factors: {}, hit: true };
  /** 20 movements in one sequence: 19 at 500 ms, one at 5000 ms; end points spread along the axis. */
  const cell = () => Array.from({ length: 20 }, (_, i) => ({ ...base, sequence: 1, trial: i + 1, endX: 100 + ((i % 5) - 2), timeMs: i === 19 ? 5000 : 500 }));
  test("mt3sd (common practice): a time beyond the cell's mean ± 3 SD is removed, worked by hand", () => {
    // By hand: mean = (19·500 + 5000)/20 = 725; SS = 19·225² + 4275² = 19 237 500; SD = √(SS/19) = 1006.2;
    // |5000 − 725| = 4275 > 3·1006.2 = 3018.7, while |500 − 725| = 225 is not.
    const r = analyzeTrials(cell(), { exclude: "mt3sd", start: "nominal" });
    expect(r.exclusions.mt3sd).toBe(1);
    expect(r.excluded).toBe(1);
    expect(r.sequences[0]!.mt).toBe(500);
    expect(analyzeTrials(cell(), { exclude: "misfire", start: "nominal" }).sequences[0]!.mt).toBe(725);
  });
  test("misfire+mt3sd: misfires first, then the MT rule over what remains; counts per rule", () => {
    const rows = [...cell(), { ...base, sequence: 1, trial: 21, endX: 20, timeMs: 480 }];
    const r = analyzeTrials(rows, { exclude: "misfire+mt3sd", start: "nominal" });
    expect(r.exclusions).toMatchObject({ misfire: 1, mt3sd: 1 });
    expect(r.excluded).toBe(2);
  });
  test("a time-out counts as an error by default, is exempt from the misfire rule, and can be dropped", () => {
    const rows: TrialRow[] = cell().slice(0, 10);
    rows[3] = { ...rows[3]!, endX: 10, timedOut: true, hit: true, timeMs: 10_000 };
    const kept = analyzeTrials(rows, { start: "nominal" });
    expect(kept.timeoutsKept).toBe(1);
    expect(kept.excluded).toBe(0);
    expect(kept.sequences[0]!.errorRate).toBeCloseTo(0.1, 12);
    expect(kept.sequences[0]!.timedOut).toBe(1);
    const dropped = analyzeTrials(rows, { start: "nominal", dropFlagged: ["timed_out"] });
    expect(dropped.exclusions.timed_out).toBe(1);
    expect(dropped.sequences[0]!.n).toBe(9);
    expect(dropped.sequences[0]!.errorRate).toBe(0);
  });
});

describe("one rule for values that cannot be computed", () => {
  test("a sequence with We = 0 is left out everywhere; its participant, lacking a cell, from every test", () => {
    const rows = small();
    // P03's only stick-6 sequence at A = 128, W = 16: every end point on the target centre → SDx = 0.
    const target = rows.filter((r) => r.participant === "P03" && r.condition === "stick-6");
    const keys = new Set(target.map((r) => r.sequence));
    const flat = rows.map((r) => (r.participant === "P03" && r.condition === "stick-6" ? { ...r, endX: r.toX, endY: r.toY, hit: true } : r));
    const r = analyzeTrials(flat);
    expect(r.sequencesDropped.filter((d) => d.participant === "P03").length).toBe(keys.size);
    expect(r.sequencesDropped[0]!.reason).toMatch(/We = 0/);
    expect(r.cells.some((c) => c.participant === "P03" && c.condition === "stick-6")).toBe(false);
    expect(r.missing.participants).toEqual([{ participant: "P03", reason: "no value in condition stick-6" }]);
    // The same 4 participants in the ANOVA, the post hoc tests and Friedman's test.
    expect(r.anova[0]!.df2).toBe(3 * 3);
    expect(r.posthoc[0]!.df).toBe(3);
    expect(r.friedman!.n).toBe(4);
    expect(r.rule).toMatch(/never averaged/);
    // No NaN anywhere in the JSON: a value that cannot be computed is null.
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
  });
  test("every statistic in the JSON is a finite number or null (property over random small tables)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 4 }), fc.integer({ min: 1, max: 1000 }), (participants, seed) => {
        const r = analyzeTrials(generateTrialRows({ participants, gains: [4, 6], techniques: ["motion"], amplitudes: [128], widths: [16, 32], targetsPerRing: 5, seed }));
        JSON.stringify(r, (_k, v: unknown) => {
          if (typeof v === "number") expect(Number.isFinite(v)).toBe(true);
          return v;
        });
      }),
      { numRuns: 15 },
    );
  });
});

describe("mixed designs from b_ columns", () => {
  const grouped = () => small().map((r) => ({ ...r, groups: { group: ["P01", "P02", "P03"].includes(r.participant) ? "novice" : "gamer" } }));
  test("between effects, their interactions and post hoc within and between groups", () => {
    const r = analyzeTrials(grouped());
    expect(r.anova.map((a) => `${a.effect}/${a.kind}`)).toEqual([
      "condition/within",
      "technique/within", "gain/within", "group/between",
      "technique:gain/within", "technique:group/mixed", "gain:group/mixed",
      "technique:gain:group/mixed",
    ]);
    // N = 5 in g = 2 groups: within effects have (N − g)·p = 3 error df, between effects N − g = 3.
    expect(r.anova.find((a) => a.effect === "group")!.df2).toBe(3);
    expect(r.anova.find((a) => a.effect === "technique:group")!.df2).toBe(3);
    expect(r.groups?.groups.map((g) => [g.group, g.participants])).toEqual([["gamer", 2], ["novice", 3]]);
    expect(r.posthocWithinGroups!.length).toBe(2 * 6);
    expect(r.posthocBetweenGroups!.length).toBe(4);
    expect(r.cells[0]!.groups).toEqual({ group: "novice" });
  });
  test("a between factor that changes within a participant is bad input naming the line and column", () => {
    const rows = grouped().map((r, i) => (i === 40 ? { ...r, groups: { group: r.groups.group === "novice" ? "gamer" : "novice" }, line: 42 } : r));
    expect(() => analyzeTrials(rows, { file: "t.csv" })).toThrow(/^t\.csv:42:b_group: participant P\d+ is in level/);
  });
  test("a between factor with one level is bad input", () => {
    expect(() => analyzeTrials(small().map((r) => ({ ...r, groups: { group: "novice" } })), { file: "t.csv" })).toThrow('t.csv:1:b_group: between factor group has a single level ("novice"); a between factor needs at least 2');
  });
});

describe("view mode on the sphere (science.md §1; spherical trigonometry)", () => {
  // Spherical law of cosines (any spherical trigonometry text): cos c = sin φ1 sin φ2 + cos φ1 cos φ2 cos Δλ,
  // an independent way to the great-circle distance than the code's atan2(|S × T|, S·T).
  const lawOfCosines = (y1: number, p1: number, y2: number, p2: number) => {
    const r = Math.PI / 180;
    return Math.acos(Math.min(1, Math.sin(p1 * r) * Math.sin(p2 * r) + Math.cos(p1 * r) * Math.cos(p2 * r) * Math.cos((y2 - y1) * r))) / r;
  };
  test("the amplitude is the great-circle distance: 20° of yaw at 60° pitch is about 10°, not 20°", () => {
    const m = projectMovement(0, 60, 20, 60, 20, 60, "sphere");
    expect(m.a).toBeCloseTo(lawOfCosines(0, 60, 20, 60), 9);
    expect(m.a).toBeCloseTo(9.9619, 3); // cos c = 0.75 + 0.25·cos 20° = 0.98492
    expect(m.dx).toBeCloseTo(0, 9);
    expect(projectMovement(0, 60, 20, 60, 20, 60).a).toBe(20);
  });
  test("dx is the signed angle along the great circle; the end error is P's great-circle distance from T", () => {
    fc.assert(
      fc.property(fc.double({ min: -60, max: 60, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), (yaw, pitch, ey, ep) => {
        const t = { x: yaw + 25, y: pitch / 2 };
        const m = projectMovement(yaw, pitch, t.x, t.y, t.x + ey, t.y + ep, "sphere");
        expect(m.a).toBeCloseTo(lawOfCosines(yaw, pitch, t.x, t.y), 6);
        expect(m.endError).toBeCloseTo(lawOfCosines(t.x, t.y, t.x + ey, t.y + ep), 5);
        // Right spherical triangle T, foot F, P (Napier's rules): cos TP = cos TF · cos FP, with TF = |dx|.
        const r = Math.PI / 180;
        expect(Math.cos(m.endError * r)).toBeCloseTo(Math.cos(m.dx * r) * Math.cos(m.across * r), 9);
      }),
    );
  });
  test("the analysis reads view tables on the sphere when asked (and only with unit deg)", () => {
    const rows = [0, 1, 2].map((i) => ({ participant: "P1", condition: "A", block: 1, sequence: 1, trial: i + 1, amplitude: 10, width: 2, factors: {}, fromX: 0, fromY: 60, toX: 20, toY: 60, startX: 0, startY: 60, endX: 20 + (i - 1) * 0.5, endY: 60, timeMs: 500, hit: true }));
    const r = analyzeTrials(rows, { unit: "deg", geometry: "sphere", start: "nominal" });
    expect(r.geometry).toBe("sphere");
    expect(r.sequences[0]!.ae).toBeCloseTo(lawOfCosines(0, 60, 20, 60), 2);
    expect(() => analyzeTrials(rows, { unit: "px", geometry: "sphere" })).toThrow(/sphere geometry needs unit deg/);
  });
});
