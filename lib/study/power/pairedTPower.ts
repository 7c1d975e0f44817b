import { jStat } from "@/lib/stats/jstat";

/**
 * Power of the two-sided paired t test (pairedTPower).
 *
 * Purpose: the analytic answer the simulated power curve is checked against: with n pairs whose
 * differences are normal with mean δ and SD σ_d, t = d̄/(s_d/√n) follows a noncentral t with
 * n − 1 degrees of freedom and noncentrality δ/σ_d·√n, so power = P(|t| > t₁₋α/₂) =
 * 1 − F(t_c) + F(−t_c). Source: Cohen, Statistical Power Analysis for the Behavioral Sciences
 * (1988), ch. 2 (d_z for dependent samples); jstat's noncentral t distribution.
 * Cost: two noncentral-t CDFs (series of ≥ 200 terms).
 * @throws Error "pairedTPower requires n ≥ 2 and σ_d > 0".
 * @example pairedTPower(0.5, 1, 34) // ≈ 0.81 (d_z = 0.5 at n = 34)
 */
export function pairedTPower(delta: number, sdDifference: number, n: number, alpha = 0.05): number {
  if (!(n >= 2) || !(sdDifference > 0)) throw new Error("pairedTPower requires n ≥ 2 and σ_d > 0");
  const df = n - 1;
  const tc = jStat.studentt.inv(1 - alpha / 2, df);
  const ncp = (delta / sdDifference) * Math.sqrt(n);
  const F = (x: number) => (jStat as unknown as { noncentralt: { cdf(x: number, df: number, ncp: number): number } }).noncentralt.cdf(x, df, ncp);
  return 1 - F(tc) + F(-tc);
}
