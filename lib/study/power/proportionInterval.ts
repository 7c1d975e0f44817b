import { jStat } from "@/lib/stats/jstat";

/**
 * Exact (Clopper–Pearson) interval of a binomial proportion (clopperPearson).
 *
 * Purpose: the Monte Carlo interval of a simulated power: k detections in m simulated studies.
 * Bounds from the beta distribution: lower = B⁻¹(α/2; k, m − k + 1), upper = B⁻¹(1 − α/2; k + 1, m − k).
 * Source: Clopper & Pearson, Biometrika 26:404–413 (1934). Cost: two beta quantiles (jstat).
 * @throws Error "clopperPearson requires 0 ≤ k ≤ m and m ≥ 1".
 * @example clopperPearson(5, 10) // [0.187…, 0.812…]
 */
export function clopperPearson(k: number, m: number, level = 0.95): [number, number] {
  if (!(m >= 1) || k < 0 || k > m) throw new Error("clopperPearson requires 0 ≤ k ≤ m and m ≥ 1");
  const a = 1 - level;
  const beta = (jStat as unknown as { beta: { inv(p: number, a: number, b: number): number } }).beta;
  const lo = k === 0 ? 0 : beta.inv(a / 2, k, m - k + 1);
  const hi = k === m ? 1 : beta.inv(1 - a / 2, k + 1, m - k);
  return [lo, hi];
}
