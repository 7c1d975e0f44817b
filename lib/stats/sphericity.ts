import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { chiSquareUpperTail } from "./chiSquareUpperTail";

export interface MauchlyResult {
  /** Mauchly's W = Πλ/(Σλ/p)^p. */
  W: number;
  /** −ν·ρ·ln W, ρ = 1 − (2p² + p + 2)/(6pν). */
  chi2: number;
  /** p(p + 1)/2 − 1. */
  df: number;
  p: number;
}

/** Sphericity of one within effect: Mauchly's test and the two ε, or why they cannot be computed. */
export type SphericityResult =
  | { computable: true; mauchly: MauchlyResult; epsilonGG: number; epsilonHF: number }
  | { computable: false; reason: string };

/**
 * Sphericity of one within-subject effect from the error SSP matrix S (p × p) of its orthonormal
 * contrast scores, pooled within groups, with ν error degrees of freedom (N − g for N participants
 * in g groups; n − 1 without groups). λ are the eigenvalues of S (ml-matrix).
 * - Mauchly (1940, Ann. Math. Statist. 11:204–209): W = Πλ/(Σλ/p)^p; χ² = −ν·ρ·ln W with
 *   ρ = 1 − (2p² + p + 2)/(6pν), df = p(p + 1)/2 − 1; p = P₁ + ω₂(P₂ − P₁) with P₁, P₂ the χ² upper
 *   tails at df and df + 4 and ω₂ = (p + 2)(p − 1)(p − 2)(2p³ + 6p² + 3k + 2)/(288(νpρ)²), Anderson's
 *   second-order term as R computes it (stats::mauchly.test and car; R writes the number of
 *   within cells k where the expansion has p, and we keep R's form so the values agree with R).
 * - Greenhouse–Geisser (1959): ε = (Σλ)²/(pΣλ²), 1/p ≤ ε ≤ 1 by the Cauchy–Schwarz inequality.
 * - Huynh–Feldt as R (car, afex) reports it, Lecoutre's (1991) correction:
 *   ε̃ = ((ν + 1)pε − 2)/(p(ν − pε)), printed uncapped (it may exceed 1); a p value uses min(1, ε̃).
 * With ν < p the matrix is singular (fewer error degrees of freedom than contrasts): none of these
 * can be computed, as R says too. A matrix whose smallest eigenvalue is below 1e-12 of the largest
 * is treated alike (numerically singular: the scores lie in a subspace). p = 1 needs none of this.
 *
 * Cost: O(p³).
 * @throws Error when S is not square, p < 2, ν < 1 or k < p + 1.
 * @example sphericity([[4, 1], [1, 3]], 9, 3) // {computable: true, mauchly: {W: 0.9231, …}, epsilonGG: 0.9643…, epsilonHF: 1.2097…}
 */
export function sphericity(sspe: readonly (readonly number[])[], errorDf: number, cells: number): SphericityResult {
  const p = sspe.length;
  if (p < 2 || sspe.some((row) => row.length !== p)) throw new Error("sphericity requires a square error matrix of at least 2 × 2");
  if (!(errorDf >= 1)) throw new Error("sphericity requires at least 1 error degree of freedom");
  if (!(cells >= p + 1)) throw new Error("sphericity requires more within cells than contrasts");
  if (errorDf < p) {
    return {
      computable: false,
      reason: `the pooled covariance of the ${p} contrasts has only ${errorDf} error degree${errorDf === 1 ? "" : "s"} of freedom (needs ≥ ${p}): it is singular, so Mauchly's test and the Greenhouse–Geisser and Huynh–Feldt ε cannot be computed`,
    };
  }
  const eig = new EigenvalueDecomposition(new Matrix(sspe.map((r) => [...r])), { assumeSymmetric: true });
  const lambdas = eig.realEigenvalues;
  const largest = Math.max(...lambdas);
  const smallest = Math.min(...lambdas);
  if (!(largest > 0) || !(smallest > 1e-12 * largest)) {
    return { computable: false, reason: "the pooled covariance of the contrasts is singular (the scores lie in a subspace): Mauchly's test and the Greenhouse–Geisser and Huynh–Feldt ε cannot be computed" };
  }
  const sum = lambdas.reduce((s, l) => s + l, 0);
  const sumSq = lambdas.reduce((s, l) => s + l * l, 0);
  const epsilonGG = (sum * sum) / (p * sumSq);
  const epsilonHF = ((errorDf + 1) * p * epsilonGG - 2) / (p * (errorDf - p * epsilonGG));
  const logW = lambdas.reduce((s, l) => s + Math.log(l), 0) - p * Math.log(sum / p);
  const rho = 1 - (2 * p * p + p + 2) / (6 * p * errorDf);
  const omega2 = ((p + 2) * (p - 1) * (p - 2) * (2 * p ** 3 + 6 * p * p + 3 * cells + 2)) / (288 * (errorDf * p * rho) ** 2);
  const chi2 = -errorDf * rho * logW;
  const df = (p * (p + 1)) / 2 - 1;
  const p1 = chiSquareUpperTail(Math.max(0, chi2), df) ?? 1;
  const p2 = chiSquareUpperTail(Math.max(0, chi2), df + 4) ?? 1;
  return { computable: true, mauchly: { W: Math.exp(logW), chi2, df, p: p1 + omega2 * (p2 - p1) }, epsilonGG, epsilonHF: Number.isFinite(epsilonHF) && epsilonHF > 0 ? epsilonHF : 1 };
}
