import { jStat } from "./jstat";
import { orthonormalContrasts } from "./orthonormalContrasts";
import { sphericity, type MauchlyResult } from "./sphericity";

/** One within-subject factor: its name and its number of levels. */
export interface WithinFactor {
  name: string;
  levels: number;
}

/** One effect row of a repeated-measures ANOVA. NaN where undefined (serialises as null). */
export interface RmAnovaEffect {
  /** Factor name, or names joined by ":" for interactions (e.g. "technique:gain"). */
  effect: string;
  df1: number;
  df2: number;
  F: number;
  p: number;
  epsilonGG: number;
  pGG: number;
  epsilonHF: number;
  pHF: number;
  partialEta2: number;
  generalizedEta2: number;
  ssEffect: number;
  ssError: number;
  mauchly: MauchlyResult;
}

function kron(a: number[][], b: number[][]): number[][] {
  const out: number[][] = [];
  for (const ra of a) for (const rb of b) {
    const row: number[] = [];
    for (const x of ra) for (const y of rb) row.push(x * y);
    out.push(row);
  }
  return out;
}

function subsets(k: number): number[][] {
  const all: number[][] = [];
  for (let mask = 1; mask < 1 << k; mask++) {
    const s: number[] = [];
    for (let i = 0; i < k; i++) if (mask & (1 << i)) s.push(i);
    all.push(s);
  }
  return all.sort((x, y) => x.length - y.length || x.join(",").localeCompare(y.join(",")));
}

function upperF(F: number, df1: number, df2: number): number {
  if (Number.isNaN(F)) return Number.NaN;
  if (F === Number.POSITIVE_INFINITY) return 0;
  return 1 - jStat.centralF.cdf(F, df1, df2);
}

/**
 * Repeated-measures (within-subject) ANOVA, one-way or full factorial over any number of factors.
 * Each effect is tested against its own effect × subject error (any design text, e.g. Maxwell &
 * Delaney, "Designing Experiments and Analyzing Data", ch. 11–12), computed through orthonormal
 * contrasts: for effect E the scores Z = Y·C_E with C_E the Kronecker product of Helmert contrasts
 * for the factors in E and 1/√l averaging vectors for the others; SS_effect = n·Σ z̄², SS_error =
 * Σ(z − z̄)², F = (SS_effect/df1)/(SS_error/df2), df1 = Π(l − 1), df2 = df1·(n − 1). Sphericity
 * (Mauchly, Greenhouse–Geisser, Huynh–Feldt) from the covariance of Z; partial η² =
 * SS_effect/(SS_effect + SS_error); generalised η² = SS_effect/(SS_effect + SS_subjects + ΣSS_error)
 * for all-within designs (Olejnik & Algina 2003, Psychol. Methods 8:434–447; Bakeman 2005).
 *
 * `data[s][c]` is subject s in cell c; cells run over the factors' levels with the first factor
 * slowest (row-major), so for one factor they are just its levels.
 *
 * Cost: O(n·c·c) per effect.
 * @throws Error when fewer than 2 subjects, a factor has fewer than 2 levels, a row has the wrong
 *   number of cells, or a value is not finite.
 * @example rmAnova([[1, 2], [2, 4], [3, 5]], [{name: "condition", levels: 2}])[0] // {effect: "condition", df1: 1, df2: 2, F: 28, p: 0.0339…, …}
 */
export function rmAnova(data: readonly (readonly number[])[], factors: readonly WithinFactor[]): RmAnovaEffect[] {
  const n = data.length;
  if (n < 2) throw new Error("rmAnova requires at least 2 subjects");
  if (factors.length === 0) throw new Error("rmAnova requires at least 1 factor");
  for (const f of factors) {
    if (!Number.isInteger(f.levels) || f.levels < 2) throw new Error(`rmAnova requires at least 2 levels of factor ${f.name}`);
  }
  const cells = factors.reduce((c, f) => c * f.levels, 1);
  for (const row of data) {
    if (row.length !== cells) throw new Error(`rmAnova requires ${cells} cells per subject, got ${row.length}`);
    if (row.some((v) => !Number.isFinite(v))) throw new Error("rmAnova requires finite values");
  }
  const grand = data.reduce((s, r) => s + r.reduce((a, b) => a + b, 0), 0) / (n * cells);
  const ssSubjects = cells * data.reduce((s, r) => s + (r.reduce((a, b) => a + b, 0) / cells - grand) ** 2, 0);

  const partial = subsets(factors.length).map((members) => {
    let contrast: number[][] = [[1]];
    factors.forEach((f, i) => {
      const part = members.includes(i)
        ? orthonormalContrasts(f.levels)
        : Array.from({ length: f.levels }, () => [1 / Math.sqrt(f.levels)]);
      contrast = kron(contrast, part);
    });
    const p = contrast[0]!.length;
    const z = data.map((row) => {
      const scores = new Array<number>(p).fill(0);
      row.forEach((v, c) => {
        const weights = contrast[c]!;
        for (let j = 0; j < p; j++) scores[j]! += v * weights[j]!;
      });
      return scores;
    });
    const means = new Array<number>(p).fill(0);
    for (const s of z) for (let j = 0; j < p; j++) means[j]! += s[j]! / n;
    const ssEffect = n * means.reduce((s, m) => s + m * m, 0);
    const cov = Array.from({ length: p }, () => new Array<number>(p).fill(0));
    let ssError = 0;
    for (const s of z) {
      for (let i = 0; i < p; i++) {
        const di = s[i]! - means[i]!;
        ssError += di * di;
        for (let j = 0; j < p; j++) cov[i]![j]! += (di * (s[j]! - means[j]!)) / (n - 1);
      }
    }
    const df1 = p;
    const df2 = p * (n - 1);
    const F = ssError > 0 ? ssEffect / df1 / (ssError / df2) : ssEffect > 0 ? Number.POSITIVE_INFINITY : Number.NaN;
    const sph = sphericity(cov, n);
    return {
      effect: members.map((i) => factors[i]!.name).join(":"),
      df1,
      df2,
      F,
      p: upperF(F, df1, df2),
      epsilonGG: sph.epsilonGG,
      pGG: upperF(F, df1 * sph.epsilonGG, df2 * sph.epsilonGG),
      epsilonHF: sph.epsilonHF,
      pHF: upperF(F, df1 * sph.epsilonHF, df2 * sph.epsilonHF),
      partialEta2: ssEffect / (ssEffect + ssError),
      ssEffect,
      ssError,
      mauchly: sph.mauchly,
    };
  });
  const ssErrorTotal = partial.reduce((s, e) => s + e.ssError, 0);
  return partial.map((e) => ({ ...e, generalizedEta2: e.ssEffect / (e.ssEffect + ssSubjects + ssErrorTotal) }));
}
