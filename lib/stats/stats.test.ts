import fc from "fast-check";
import { linearRegression, sampleStandardDeviation, tTest, mean } from "simple-statistics";
import { describe, expect, test } from "vitest";
import { friedman, holm, leastSquaresLine, orthonormalContrasts, pairedT, rmAnova, sphericity, tInterval } from "./index";
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
    // Reference: simple-statistics sampleStandardDeviation (n − 1).
    expect(r.dz).toBeCloseTo(mean(d) / sampleStandardDeviation(d), 12);
    // simple-statistics' tTest divides by the population SD (n), so it is larger by √(n/(n − 1)).
    expect(tTest(d, 0)).toBeCloseTo(r.t * Math.sqrt(6 / 5), 10);
  });
  test("rejects one pair", () => {
    expect(() => pairedT([1], [2])).toThrow("pairedT requires at least 2 pairs");
  });
});

describe("t interval", () => {
  test("uses t(0.975, 9) = 2.262 (printed t tables, e.g. any statistics textbook)", () => {
    const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const r = tInterval(values);
    const half = (r.ci95[1] - r.ci95[0]) / 2;
    expect(half / (r.sd / Math.sqrt(10))).toBeCloseTo(2.262, 3);
    expect(r.mean).toBe(5.5);
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
  test("agrees with simple-statistics linearRegression and a hand-worked case", () => {
    // By hand: x̄ = 2, Sxy = 4.5, Sxx = 2 → slope 2.25, intercept 4.1667 − 4.5 = −0.3333;
    // SSres = 0.041667, SStot = 10.1667 → r² = 0.99590.
    const r = leastSquaresLine([1, 2, 3], [2, 4, 6.5]);
    expect(r.slope).toBeCloseTo(2.25, 12);
    expect(r.intercept).toBeCloseTo(-1 / 3, 12);
    expect(r.r2).toBeCloseTo(0.9959, 4);
    const ref = linearRegression([[1, 2], [2, 4], [3, 6.5]]);
    expect(r.slope).toBeCloseTo(ref.m, 12);
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

describe("repeated-measures ANOVA", () => {
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
  test("GG ε lies within [1/(k−1), 1] and HF ε ≥ GG ε (property)", () => {
    fc.assert(
      fc.property(subjectsArb(4), (data) => {
        const [row] = rmAnova(data, [{ name: "c", levels: 4 }]);
        if (Number.isNaN(row!.epsilonGG)) return;
        expect(row!.epsilonGG).toBeGreaterThanOrEqual(1 / 3 - EPS);
        expect(row!.epsilonGG).toBeLessThanOrEqual(1 + EPS);
        expect(row!.epsilonHF).toBeLessThanOrEqual(1 + EPS);
      }),
    );
  });
  test("rejects one subject and ragged rows", () => {
    expect(() => rmAnova([[1, 2]], [{ name: "c", levels: 2 }])).toThrow("rmAnova requires at least 2 subjects");
    expect(() => rmAnova([[1, 2], [1]], [{ name: "c", levels: 2 }])).toThrow(/2 cells per subject/);
  });
});

describe("sphericity", () => {
  test("identity covariance: W = 1, ε = 1; a rank-1 covariance gives GG ε = 1/p (Greenhouse & Geisser 1959 lower bound)", () => {
    const s = sphericity([[2, 0, 0], [0, 2, 0], [0, 0, 2]], 10);
    expect(s.mauchly.W).toBeCloseTo(1, 12);
    expect(s.epsilonGG).toBeCloseTo(1, 12);
    const v = [1, 2, 3];
    const rank1 = v.map((a) => v.map((b) => a * b));
    expect(sphericity(rank1, 10).epsilonGG).toBeCloseTo(1 / 3, 9);
  });
  test("Mauchly χ² follows the formula −(1 − f)(n − 1)·ln W on a worked case", () => {
    // Eigenvalues of diag(1, 4): W = 4/2.5² = 0.64; f = (8 + 2 + 2)/(6·2·9) = 1/9; χ² = −(8/9)·9·ln 0.64.
    const s = sphericity([[1, 0], [0, 4]], 10);
    expect(s.mauchly.W).toBeCloseTo(0.64, 12);
    expect(s.mauchly.chi2).toBeCloseTo(-8 * Math.log(0.64), 9);
    expect(s.mauchly.df).toBe(2);
    // GG by hand: (1 + 4)² / (2·(1 + 16)) = 25/34.
    expect(s.epsilonGG).toBeCloseTo(25 / 34, 12);
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
