import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { jStat } from "./jstat";

export interface MauchlyResult {
  /** Mauchly's W (1 when the effect has a single degree of freedom). */
  W: number;
  chi2: number;
  df: number;
  /** NaN when df = 0 (nothing to test). */
  p: number;
}

export interface SphericityResult {
  mauchly: MauchlyResult;
  epsilonGG: number;
  epsilonHF: number;
}

/**
 * Sphericity of one repeated-measures effect from the covariance S (p × p) of its orthonormal
 * contrast scores over n subjects: Mauchly's test (Mauchly 1940, Ann. Math. Statist. 11:204–209)
 * W = Πλ/(Σλ/p)^p, χ² = −(1 − f)(n − 1)·ln W, f = (2p² + p + 2)/(6p(n − 1)), df = p(p + 1)/2 − 1;
 * Greenhouse–Geisser ε = (Σλ)²/(pΣλ²) (Greenhouse & Geisser 1959), bounded by 1/p ≤ ε ≤ 1;
 * Huynh–Feldt ε̃ = (n·p·ε − 2)/(p(n − 1 − p·ε)), capped at 1 and floored at 1/p (Huynh & Feldt 1976). λ are the
 * eigenvalues of S (ml-matrix). With p = 1 all epsilons are 1 and W = 1.
 *
 * Cost: O(p³).
 * @throws Error when S is not square or n < 2.
 * @example sphericity([[1, 0], [0, 1]], 10) // {mauchly: {W: 1, chi2: 0, df: 2, p: 1}, epsilonGG: 1, epsilonHF: 1}
 */
export function sphericity(covariance: readonly (readonly number[])[], n: number): SphericityResult {
  const p = covariance.length;
  if (p === 0 || covariance.some((row) => row.length !== p)) throw new Error("sphericity requires a square covariance matrix");
  if (n < 2) throw new Error("sphericity requires at least 2 subjects");
  if (p === 1) return { mauchly: { W: 1, chi2: 0, df: 0, p: Number.NaN }, epsilonGG: 1, epsilonHF: 1 };
  const eig = new EigenvalueDecomposition(new Matrix(covariance.map((r) => [...r])), { assumeSymmetric: true });
  const lambdas = eig.realEigenvalues.map((l) => Math.max(l, 0));
  const sum = lambdas.reduce((s, l) => s + l, 0);
  const sumSq = lambdas.reduce((s, l) => s + l * l, 0);
  const epsilonGG = sum > 0 ? Math.min(1, Math.max(1 / p, (sum * sum) / (p * sumSq))) : Number.NaN;
  const hfDenominator = p * (n - 1 - p * epsilonGG);
  const epsilonHF = Number.isNaN(epsilonGG)
    ? Number.NaN
    : hfDenominator <= 0
      ? 1
      : Math.min(1, Math.max(1 / p, (n * p * epsilonGG - 2) / hfDenominator));
  const W = sum > 0 ? lambdas.reduce((prod, l) => prod * (l / (sum / p)), 1) : Number.NaN;
  const f = (2 * p * p + p + 2) / (6 * p * (n - 1));
  const chi2 = -(1 - f) * (n - 1) * Math.log(W);
  const df = (p * (p + 1)) / 2 - 1;
  const pValue = Number.isFinite(chi2) ? 1 - jStat.chisquare.cdf(chi2, df) : W === 0 ? 0 : Number.NaN;
  return { mauchly: { W, chi2, df, p: pValue }, epsilonGG, epsilonHF };
}
