/**
 * Minimum-jerk position profile (minimumJerkFraction).
 *
 * Purpose: the fraction of the way travelled at normalised time τ = t/MT of an aimed movement,
 * 10τ³ − 15τ⁴ + 6τ⁵ (clamped to 0..1 outside the movement). Source: Flash & Hogan, J. Neurosci.
 * 5:1688–1703 (1985). Cost: O(1).
 * @throws never.
 * @example minimumJerkFraction(0.5) // 0.5
 */
export function minimumJerkFraction(tau: number): number {
  if (tau <= 0) return 0;
  if (tau >= 1) return 1;
  const t3 = tau * tau * tau;
  return t3 * (10 - 15 * tau + 6 * tau * tau);
}

/**
 * Fitts-like movement time (fittsMovementTimeMs).
 *
 * Purpose: MT = a + b·log2(A/W + 1) (Shannon form) for the simulated participant.
 * Source: MacKenzie, HCI 7:91–139 (1992); science.md §9. Cost: O(1).
 * @throws Error "fittsMovementTimeMs requires a positive width".
 * @example fittsMovementTimeMs(300, 150, 448, 64) // 750
 */
export function fittsMovementTimeMs(interceptMs: number, slopeMsPerBit: number, amplitude: number, width: number): number {
  if (!(width > 0)) throw new Error("fittsMovementTimeMs requires a positive width");
  return interceptMs + slopeMsPerBit * Math.log2(amplitude / width + 1);
}
