import fc from "fast-check";
import { linearRegression, mean } from "simple-statistics";
import { describe, expect, test } from "vitest";
import { generateTrialRows } from "../../experiments/generate";
import type { TrialRow } from "../trials";
import { TrialTableError } from "../trials";
import {
  analyzeLegacyTrials,
  analyzeTrials,
  EFFECTIVE_WIDTH_FACTOR,
  isMisfire,
  mergeSequenceStates,
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
        out.conditions.forEach((c, i) => expect(c.tp.mean).toBeCloseTo(ref.conditions[i]!.tp.mean, 9));
        out.anova.forEach((a, i) => expect(a.F).toBeCloseTo(ref.anova[i]!.F, 6));
      }),
      { numRuns: 10 },
    );
  });
  test("duplicating every participant leaves the condition means unchanged", () => {
    const twice = [...rows, ...rows.map((r) => ({ ...r, participant: r.participant + "b" }))];
    const out = analyzeTrials(twice);
    expect(out.cells).toHaveLength(2 * ref.cells.length);
    out.conditions.forEach((c, i) => {
      expect(c.tp.mean).toBeCloseTo(ref.conditions[i]!.tp.mean, 9);
      expect(c.mt.mean).toBeCloseTo(ref.conditions[i]!.mt.mean, 9);
      expect(c.n).toBe(2 * ref.conditions[i]!.n);
    });
  });
  test("Fitts regression agrees with simple-statistics linearRegression on the A×W means", () => {
    for (const reg of ref.regression) {
      const seqs = ref.sequences.filter((s) => s.condition === reg.condition);
      const keys = [...new Set(seqs.map((s) => `${s.amplitude}/${s.width}`))];
      const pts = keys.map((k) => {
        const g = seqs.filter((s) => `${s.amplitude}/${s.width}` === k);
        return [mean(g.map((s) => s.ide)), mean(g.map((s) => s.mt))];
      });
      const fit = linearRegression(pts);
      expect(reg.slope).toBeCloseTo(fit.m, 9);
      expect(reg.intercept).toBeCloseTo(fit.b, 9);
      expect(reg.points).toBe(4);
    }
  });
  test("the simulator's built-in We ≈ W is recovered (pipeline consistency, not an outside reference)", () => {
    const many = analyzeTrials(generateTrialRows({ participants: 10, gains: [4], amplitudes: [256], widths: [32], seed: 11, slipRate: 0 }), { start: "nominal" });
    // End points drawn with σ = W/4.133 along the axis, so mean We should be near W = 32.
    expect(mean(many.sequences.map((s) => s.we))).toBeGreaterThan(28);
    expect(mean(many.sequences.map((s) => s.we))).toBeLessThan(36);
  });
  test("two halves merged equal the whole (mergeSequenceStates)", () => {
    const opts = { start: "actual" as const, exclude: "misfire" as const, file: "x" };
    const whole = new TrialAccumulator(opts), a = new TrialAccumulator(opts), b = new TrialAccumulator(opts);
    rows.forEach((r, i) => { whole.add(r); (i < rows.length / 2 ? a : b).add(r); });
    for (const [key, s] of whole.states) {
      const sa = a.states.get(key), sb = b.states.get(key);
      const m = sa && sb ? mergeSequenceStates(sa, sb) : (sa ?? sb)!;
      expect(m.dxM2).toBeCloseTo(s.dxM2, 6);
      expect(m.kept).toBe(s.kept);
    }
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
  test("factorial rows for f_ factors, named like technique:gain", () => {
    const r = analyzeTrials(small(), {}, undefined);
    expect(r.anova.map((a) => a.effect)).toEqual(["condition", "gain", "technique", "gain:technique"]);
  });
  test("legacy tables: widths from error rate, flagged", () => {
    const r = analyzeLegacyTrials(small().map(({ fromX: _a, fromY: _b, toX: _c, toY: _d, startX: _e, startY: _f, endX: _g, endY: _h, ...rest }) => rest));
    expect(r.widthMethod).toBe("errorRate");
    expect(r.notes[0]).toMatch(/error rates/);
    const s = r.sequences[0]!;
    expect(s.we).toBeCloseTo(widthFromErrorRate(s.width, s.errorRate), 12);
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
  test("per sequence means through analyzeTrials with sampled paths", () => {
    const rows = small().slice(0, 9);
    const paths = new Map(rows.map((r) => [movementKey(r.participant, r.condition, r.block, r.sequence, r.trial), [{ x: r.fromX, y: r.fromY }, { x: (r.fromX + r.toX) / 2 + 3, y: (r.fromY + r.toY) / 2 }, { x: r.endX, y: r.endY }]]));
    const out = analyzeTrials(rows, {}, paths);
    expect(out.sequences[0]!.path?.movements).toBe(out.sequences[0]!.n);
    expect(out.pathMovements?.length).toBe(out.sequences[0]!.n);
  });
});
