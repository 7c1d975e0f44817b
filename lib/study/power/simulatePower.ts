import { createSeededRandom } from "@/lib/motion/simulate/prng";
import { holm } from "@/lib/stats/holm";
import { pairedT } from "@/lib/stats/pairedT";
import { rmAnova } from "@/lib/stats/rmAnova";
import { clopperPearson } from "./proportionInterval";

/** What the Monte Carlo needs to know of the study and of the hypothesis. */
export interface PowerModel {
  /** For each condition, the index of its level of the main factor (0 … levels − 1). */
  mainLevelOfCondition: readonly number[];
  levels: number;
  /** For each condition, the SD of a cell's throughput from its finite movements (bits/s). */
  cellSd: readonly number[];
  /** The smallest throughput difference worth detecting, between the first and the last level (bits/s). */
  smallestDifference: number;
  /** SD across people of their own difference between the first and the last level (bits/s). */
  spreadBetweenPeople: number;
  alpha: number;
}

export interface PowerPoint {
  n: number;
  detected: number;
  studies: number;
  share: number;
  /** 95 % Clopper–Pearson interval of the share. */
  lo: number;
  hi: number;
}

/**
 * One simulated study's verdict (detects): the main factor's repeated-measures ANOVA on each
 * person's level means (equal to the main effect of the factorial within-subject ANOVA), p with
 * the Greenhouse–Geisser correction for more than two levels, below α; and the Holm-corrected
 * paired t test between the first and last levels, over all level pairs, below α.
 */
function detects(levelMeans: number[][], levels: number, alpha: number): boolean {
  const effect = rmAnova(levelMeans, [{ name: "main", levels }])[0]!;
  // GG cannot be computed with fewer error df than levels − 1: the lower-bound ε (conservative) then.
  const p = levels > 2 ? (effect.pGG ?? effect.pLowerBound) : effect.p;
  if (p === null || !(p < alpha)) return false;
  if (levels === 2) return true;
  const pairs: [number, number][] = [];
  for (let a = 0; a < levels; a++) for (let b = a + 1; b < levels; b++) pairs.push([a, b]);
  const ps = pairs.map(([a, b]) => pairedT(levelMeans.map((r) => r[b]!), levelMeans.map((r) => r[a]!)).p);
  const adjusted = holm(ps);
  const extreme = pairs.findIndex(([a, b]) => a === 0 && b === levels - 1);
  const q = adjusted[extreme];
  return q !== null && q !== undefined && q < alpha;
}

/**
 * Simulated power of a study's main comparison at each N (simulatePower).
 *
 * Purpose: the power curve beside "planned participants". Each simulated person's own difference
 * between the main factor's first and last levels is D = δ + σ_p·z; the levels between lie half-way
 * (Cohen 1988's minimum-variability pattern for k means); every other factor has no effect. A cell's
 * throughput adds normal noise of that condition's cell SD (from the simulated participant at its
 * settings). Each person's level means (over the other factors' conditions) go through the
 * project's ANOVA and Holm post hoc (`detects`). Seeded: the same inputs give the same curve.
 * Source: Monte Carlo power (e.g. Cohen 1988 for the analytic cases); science.md §4 for the tests.
 * Cost: Σ over N of studies × N × conditions normals, plus one small ANOVA per study.
 * @throws Error for fewer than 2 levels.
 * @example simulatePower(model, [10], 1000, 7)[0].share // ≈ pairedTPower(δ, √(σ_p² + s₁² + s₂²), 10)
 */
export function simulatePower(model: PowerModel, nValues: readonly number[], studies: number, seed: number, onProgress?: (done: number, total: number) => void): PowerPoint[] {
  if (model.levels < 2) throw new Error("simulatePower requires a main factor with at least 2 levels");
  const rng = createSeededRandom(seed);
  const C = model.mainLevelOfCondition.length;
  const shift = model.mainLevelOfCondition.map((j) => (j === 0 ? -0.5 : j === model.levels - 1 ? 0.5 : 0));
  const countPerLevel = new Array<number>(model.levels).fill(0);
  for (const j of model.mainLevelOfCondition) countPerLevel[j]!++;
  const out: PowerPoint[] = [];
  const total = nValues.length * studies;
  let done = 0;
  for (const n of nValues) {
    let detected = 0;
    for (let s = 0; s < studies; s++) {
      const means: number[][] = [];
      for (let i = 0; i < n; i++) {
        const d = model.smallestDifference + model.spreadBetweenPeople * rng.normal();
        const row = new Array<number>(model.levels).fill(0);
        for (let c = 0; c < C; c++) row[model.mainLevelOfCondition[c]!]! += shift[c]! * d + model.cellSd[c]! * rng.normal();
        for (let j = 0; j < model.levels; j++) row[j]! /= countPerLevel[j]!;
        means.push(row);
      }
      if (detects(means, model.levels, model.alpha)) detected++;
      done++;
      if (onProgress && done % 50 === 0) onProgress(done, total);
    }
    const [lo, hi] = clopperPearson(detected, studies);
    out.push({ n, detected, studies, share: detected / studies, lo, hi });
  }
  onProgress?.(total, total);
  return out;
}

/**
 * The N values of the power curve (powerCurveNs): multiples of the counterbalancing rows (times
 * the between-subject groups) from the first that is at least `from` up to `to`, so every N fills
 * whole rows (science.md §5: recruit in multiples of the row count). At least one value.
 * Cost: O(values).
 * @throws never.
 * @example powerCurveNs(6, 4, 60) // [6, 12, 18, 24, 30, 36, 42, 48, 54, 60]
 */
export function powerCurveNs(step: number, from = 4, to = 60): number[] {
  const first = Math.max(step, Math.ceil(from / step) * step);
  const out: number[] = [];
  for (let n = first; n <= Math.max(to, first); n += step) out.push(n);
  return out;
}
