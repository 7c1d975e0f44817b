/**
 * Two-level gain factor (twoLevelGainFactor).
 *
 * Purpose: a lower gain for slow rotation (fine aim at high gain, common practice: curves or
 * zones that reduce small rotations), full gain for fast rotation, blended linearly between.
 * Returns the multiplier of the configured gain. Source: speed-dependent CD gain (Casiez &
 * Roussel, UIST 2011, "pointer acceleration"). Cost: O(1).
 * @param speed device speed, deg/s. @param slowSpeed below it the factor is `slowFactor`.
 * @param fastSpeed above it the factor is 1 (must exceed slowSpeed).
 * @throws never.
 * @example twoLevelGainFactor(17.5, 5, 30, 0.5) // 0.75
 */
export function twoLevelGainFactor(speed: number, slowSpeed: number, fastSpeed: number, slowFactor: number): number {
  if (speed <= slowSpeed) return slowFactor;
  if (speed >= fastSpeed) return 1;
  return slowFactor + ((1 - slowFactor) * (speed - slowSpeed)) / (fastSpeed - slowSpeed);
}
