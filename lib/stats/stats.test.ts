import fc from "fast-check";
import { sampleStandardDeviation, tTest, mean } from "simple-statistics";
import { describe, expect, test } from "vitest";
import { friedman, holm, leastSquaresLine, mixedAnova, orthonormalContrasts, pairedT, rmAnova, sphericity, tInterval } from "./index";
import { jStat } from "./jstat";

const EPS = 1e-9;

const subjectsArb = (cells: number) =>
  fc.array(fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: cells, maxLength: cells }), {
    minLength: 3,
    maxLength: 12,
  });

describe("paired t", () => {
  test("t and p agree with jstat's one-sample t-test on the differences", () => {
    const a = [12.1, 14.3, 11.8, 15.2, 13.9, 12.7];
    const b = [11.0, 13.1, 12.2, 13.8, 12.5, 12.0];
    const r = pairedT(a, b);
    const d = a.map((x, i) => x - b[i]!);
    // Reference: jstat tscore(mu, sample) = (mu − mean)/(s/√n) with the sample SD, and ttest's p.
    expect(r.t).toBeCloseTo(-jStat.tscore(0, d), 10);
    expect(r.p).toBeCloseTo(jStat.ttest(0, d, 2), 10);
    // simple-statistics' tTest divides by the population SD (n), so it is larger by √(n/(n − 1)).
    expect(tTest(d, 0)).toBeCloseTo(r.t! * Math.sqrt(6 / 5), 10);
    // d_z against R: rReference.test.ts.
  });
  test("differences that do not vary: t, p and d_z are null with a reason", () => {
    const r = pairedT([2, 3, 4], [1, 2, 3]);
    expect([r.t, r.p, r.dz]).toEqual([null, null, null]);
    expect(r.note).toMatch(/do not vary/);
  });
  test("rejects one pair", () => {
    expect(() => pairedT([1], [2])).toThrow("pairedT requires at least 2 pairs");
  });
});

describe("t interval", () => {
  test("uses t(0.975, 9) = 2.262 (printed t tables, e.g. any statistics textbook)", () => {
    const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const r = tInterval(values);
    const half = (r.ci95[1]! - r.ci95[0]!) / 2;
    expect(half / (r.sd! / Math.sqrt(10))).toBeCloseTo(2.262, 3);
    expect(r.mean).toBe(5.5);
  });
  test("one value: the SD and interval are null; no value: everything is null", () => {
    expect(tInterval([4])).toEqual({ mean: 4, sd: null, ci95: [null, null] });
    expect(tInterval([])).toEqual({ mean: null, sd: null, ci95: [null, null] });
  });
});

describe("Holm", () => {
  test("hand-worked case: [0.01, 0.04, 0.03] → [0.03, 0.06, 0.06]", () => {
    // By hand (Holm 1979): sorted 0.01·3 = 0.03; 0.03·2 = 0.06; 0.04·1 = 0.04 → max(0.06, 0.04) = 0.06.
    const r = holm([0.01, 0.04, 0.03]);
    expect(r[0]).toBeCloseTo(0.03, 12);
    expect(r[1]).toBeCloseTo(0.06, 12);
    expect(r[2]).toBeCloseTo(0.06, 12);
  });
  test("hand-worked case with a cap at 1: [0.5, 0.02, 0.6, 0.01]", () => {
    // Sorted 0.01·4 = 0.04, 0.02·3 = 0.06, 0.5·2 = 1 (capped), 0.6·1 = 0.6 → running max 1.
    expect(holm([0.5, 0.02, 0.6, 0.01])).toEqual([1, 0.06, 1, 0.04]);
  });
  test("never below the raw p and monotone in the raw order (property)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 20 }), (ps) => {
        const adj = holm(ps);
        ps.forEach((p, i) => expect(adj[i]!).toBeGreaterThanOrEqual(p - EPS));
        const order = ps.map((p, i) => i).sort((i, j) => ps[i]! - ps[j]!);
        for (let k = 1; k < order.length; k++) expect(adj[order[k]!]!).toBeGreaterThanOrEqual(adj[order[k - 1]!]! - EPS);
      }),
    );
  });
});

describe("least-squares line", () => {
  test("a hand-worked case (R's lm: rReference.test.ts)", () => {
    // By hand: x̄ = 2, Sxy = 4.5, Sxx = 2 → slope 2.25, intercept 4.1667 − 4.5 = −0.3333;
    // SSres = 0.041667, SStot = 10.1667 → r² = 0.99590.
    const r = leastSquaresLine([1, 2, 3], [2, 4, 6.5]);
    expect(r.slope).toBeCloseTo(2.25, 12);
    expect(r.intercept).toBeCloseTo(-1 / 3, 12);
    expect(r.r2).toBeCloseTo(0.9959, 4);
  });
  test("not computable: one point, a non-finite point, all x equal (null with a reason)", () => {
    expect(leastSquaresLine([1], [2])).toMatchObject({ slope: null, note: expect.stringMatching(/at least 2 points/) });
    expect(leastSquaresLine([1, Number.POSITIVE_INFINITY, 3], [2, 3, 4])).toMatchObject({ slope: null, note: expect.stringMatching(/not finite/) });
    expect(leastSquaresLine([2, 2], [1, 3])).toMatchObject({ slope: null, intercept: null, r2: null });
  });
});

describe("orthonormal contrasts", () => {
  test("columns are orthonormal and sum to zero", () => {
    const c = orthonormalContrasts(5);
    for (let i = 0; i < 4; i++) {
      expect(c.reduce((s, r) => s + r[i]!, 0)).toBeCloseTo(0, 12);
      for (let j = 0; j < 4; j++) expect(c.reduce((s, r) => s + r[i]! * r[j]!, 0)).toBeCloseTo(i === j ? 1 : 0, 12);
    }
  });
});

describe("repeated-measures and mixed ANOVA (values against R: rReference.test.ts)", () => {
  test("two levels: F equals the paired t squared (t and p from jstat), GG ε = 1", () => {
    // Identity: for two levels the repeated-measures F is the square of the paired t (common practice).
    const data = [[3.1, 3.9], [2.8, 3.0], [3.5, 4.4], [2.9, 3.6], [3.3, 3.2], [3.0, 3.8]];
    const [row] = rmAnova(data, [{ name: "condition", levels: 2 }]);
    const d = data.map((r) => r[0]! - r[1]!);
    expect(row!.F).toBeCloseTo(jStat.tscore(0, d) ** 2, 9);
    expect(row!.p).toBeCloseTo(jStat.ttest(0, d, 2), 9);
    expect(row!.epsilonGG).toBe(1);
    expect(row!.df1).toBe(1);
    expect(row!.df2).toBe(5);
  });
  test("one-way: SS agrees with the classical partition SS_error = SS_total − SS_effect − SS_subjects", () => {
    const data = [[10, 12, 15, 11], [8, 9, 14, 10], [12, 15, 13, 14], [9, 11, 16, 9], [11, 10, 14, 13]];
    const n = 5, k = 4;
    const grand = data.flat().reduce((a, b) => a + b, 0) / (n * k);
    const ssTotal = data.flat().reduce((s, v) => s + (v - grand) ** 2, 0);
    const colMeans = [0, 1, 2, 3].map((j) => data.reduce((s, r) => s + r[j]!, 0) / n);
    const ssEffect = n * colMeans.reduce((s, m) => s + (m - grand) ** 2, 0);
    const ssSubjects = k * data.reduce((s, r) => s + (r.reduce((a, b) => a + b, 0) / k - grand) ** 2, 0);
    const ssError = ssTotal - ssEffect - ssSubjects;
    const [row] = rmAnova(data, [{ name: "condition", levels: k }]);
    expect(row!.ssEffect).toBeCloseTo(ssEffect, 9);
    expect(row!.ssError).toBeCloseTo(ssError, 9);
    const F = ssEffect / 3 / (ssError / 12);
    expect(row!.F).toBeCloseTo(F, 9);
    expect(row!.p).toBeCloseTo(1 - jStat.centralF.cdf(F, 3, 12), 9);
    expect(row!.generalizedEta2).toBeCloseTo(ssEffect / ssTotal, 9);
  });
  test("2 × 2 factorial: each effect's F equals the squared paired t of its contrast", () => {
    // Identity (common practice): with 1 df per effect, F = t² of the subject-wise contrast score.
    const data = [[5, 6, 7, 9], [4, 6, 6, 7], [6, 6, 8, 11], [5, 7, 6, 9], [3, 5, 7, 8]];
    const rows = rmAnova(data, [{ name: "technique", levels: 2 }, { name: "gain", levels: 2 }]);
    expect(rows.map((r) => r.effect)).toEqual(["technique", "gain", "technique:gain"]);
    const scores = {
      technique: data.map((r) => r[0]! + r[1]! - r[2]! - r[3]!),
      gain: data.map((r) => r[0]! - r[1]! + r[2]! - r[3]!),
      "technique:gain": data.map((r) => r[0]! - r[1]! - r[2]! + r[3]!),
    };
    for (const r of rows) {
      const score = scores[r.effect as keyof typeof scores];
      expect(r.F).toBeCloseTo(jStat.tscore(0, score) ** 2, 9);
      expect(r.p).toBeCloseTo(jStat.ttest(0, score, 2), 9);
    }
  });
  test("two groups × two levels: the interaction F is the squared independent t of the difference scores; the group F that of the subject means", () => {
    // Textbook identity (e.g. Maxwell & Delaney ch. 12): in a 2 (between) × 2 (within) design the
    // within × between interaction tests whether the groups' mean differences differ: F = t² of
    // Student's two-sample t (pooled variance) on d = y1 − y2; the group effect is t² on the
    // participants' means. Unequal group sizes (4 and 6).
    const a = [[3.1, 3.9], [2.8, 3.0], [3.5, 4.4], [2.9, 3.6]];
    const b = [[3.3, 3.2], [3.0, 3.8], [3.6, 3.5], [2.7, 3.1], [3.2, 3.0], [3.9, 4.1]];
    const rows = mixedAnova({ values: [...a, ...b], groups: [0, 0, 0, 0, 1, 1, 1, 1, 1, 1], within: [{ name: "gain", levels: 2 }], between: [{ name: "group", levels: 2 }], order: ["gain", "group"] });
    expect(rows.map((r) => `${r.effect} ${r.kind}`)).toEqual(["gain within", "group between", "gain:group mixed"]);
    const pooledT = (x: number[], y: number[]) => {
      const mx = mean(x), my = mean(y);
      const sp2 = ((x.length - 1) * sampleStandardDeviation(x) ** 2 + (y.length - 1) * sampleStandardDeviation(y) ** 2) / (x.length + y.length - 2);
      return (mx - my) / Math.sqrt(sp2 * (1 / x.length + 1 / y.length));
    };
    const diff = (g: number[][]) => g.map((r) => r[0]! - r[1]!);
    const avg = (g: number[][]) => g.map((r) => (r[0]! + r[1]!) / 2);
    expect(rows[2]!.F).toBeCloseTo(pooledT(diff(a), diff(b)) ** 2, 9);
    expect(rows[2]!.df2).toBe(8);
    expect(rows[1]!.F).toBeCloseTo(pooledT(avg(a), avg(b)) ** 2, 9);
  });
  test("GG ε lies within [1/(k−1), 1] and Huynh–Feldt ε ≥ GG ε (property; nothing is clamped)", () => {
    // Cauchy–Schwarz gives the GG bounds; Lecoutre's ε̃ − ε has the sign of (pε + 2)(pε − 1) ≥ 0.
    fc.assert(
      fc.property(subjectsArb(4), (data) => {
        const [row] = rmAnova(data, [{ name: "c", levels: 4 }]);
        if (row!.epsilonGG === null) {
          expect(row!.note).toMatch(/singular/);
          return;
        }
        expect(row!.epsilonGG).toBeGreaterThanOrEqual(1 / 3 - EPS);
        expect(row!.epsilonGG).toBeLessThanOrEqual(1 + EPS);
        expect(row!.epsilonHF!).toBeGreaterThanOrEqual(row!.epsilonGG - EPS);
      }),
    );
  });
  test("rejects one subject and ragged rows; a group without participants", () => {
    expect(() => rmAnova([[1, 2]], [{ name: "c", levels: 2 }])).toThrow("rmAnova requires at least 2 subjects");
    expect(() => rmAnova([[1, 2], [1]], [{ name: "c", levels: 2 }])).toThrow(/2 cells per participant/);
    expect(() => mixedAnova({ values: [[1, 2], [2, 3], [3, 5]], groups: [0, 0, 0], within: [{ name: "c", levels: 2 }], between: [{ name: "g", levels: 2 }] })).toThrow(/every combination of between levels/);
  });
});

describe("sphericity", () => {
  test("identity covariance: W = 1, ε = 1; a rank-1 covariance is singular: not computable", () => {
    const s = sphericity([[2, 0, 0], [0, 2, 0], [0, 0, 2]], 10, 4);
    expect(s.computable && s.mauchly.W).toBeCloseTo(1, 12);
    expect(s.computable && s.epsilonGG).toBeCloseTo(1, 12);
    const v = [1, 2, 3];
    const rank1 = sphericity(v.map((a) => v.map((b) => a * b)), 10, 4);
    expect(rank1.computable).toBe(false);
  });
  test("Mauchly χ² follows −ν(1 − f)·ln W on a worked case; W undefined below p error df", () => {
    // Eigenvalues of diag(1, 4): W = 4/2.5² = 0.64; ν = 9, f = (8 + 2 + 2)/(6·2·9) = 1/9; χ² = −(8/9)·9·ln 0.64.
    const s = sphericity([[1, 0], [0, 4]], 9, 3);
    if (!s.computable) throw new Error("expected a computable case");
    expect(s.mauchly.W).toBeCloseTo(0.64, 12);
    expect(s.mauchly.chi2).toBeCloseTo(-8 * Math.log(0.64), 9);
    expect(s.mauchly.df).toBe(2);
    // GG by hand: (1 + 4)² / (2·(1 + 16)) = 25/34.
    expect(s.epsilonGG).toBeCloseTo(25 / 34, 12);
    // The case: n = 3 participants, k = 4 conditions → ν = 2 < p = 3.
    const small = sphericity([[1, 0.2, 0], [0.2, 1, 0], [0, 0, 1]], 2, 4);
    expect(small.computable).toBe(false);
    expect(!small.computable && small.reason).toMatch(/only 2 error degrees of freedom \(needs ≥ 3\)/);
  });
});

describe("Friedman", () => {
  test("R's friedman.test example (Hollander & Wolfe 1973, rounding first base; from memory): χ² = 11.143, p = 0.0038", () => {
    // prettier-ignore
    const rounding = [
      [5.40, 5.50, 5.55], [5.85, 5.70, 5.75], [5.20, 5.60, 5.50], [5.55, 5.50, 5.40], [5.90, 5.85, 5.70],
      [5.45, 5.55, 5.60], [5.40, 5.40, 5.35], [5.45, 5.50, 5.35], [5.25, 5.15, 5.00], [5.85, 5.80, 5.70],
      [5.25, 5.20, 5.10], [5.65, 5.55, 5.45], [5.60, 5.35, 5.45], [5.05, 5.00, 4.95], [5.50, 5.50, 5.40],
      [5.45, 5.55, 5.50], [5.55, 5.55, 5.35], [5.45, 5.50, 5.55], [5.50, 5.45, 5.25], [5.65, 5.60, 5.40],
      [5.70, 5.65, 5.55], [6.30, 6.30, 6.25],
    ];
    const r = friedman(rounding);
    expect(r.statistic).toBeCloseTo(11.143, 3);
    expect(r.df).toBe(2);
    expect(r.p).toBeCloseTo(0.003805, 5);
  });
  test("no ties, hand-worked: rank sums 3, 7, 8 over n = 3 → Q = 12/36·122 − 36 = 4.667", () => {
    const r = friedman([[1, 2, 3], [1, 3, 2], [1, 2, 3]]);
    expect(r.statistic).toBeCloseTo(14 / 3, 12);
  });
});
