import { positivePower } from "../gain/positivePower";

/**
 * Stick rate magnitude (stickRateMagnitude).
 *
 * Purpose: rate control for a thumbstick (or tilt): radial dead zone r0 and outer edge r1,
 * m' = clamp((|s| − r0)/(r1 − r0), 0, 1), m'' = m'^p, rate = m''·rateMax. Zero inside the dead
 * zone, full rate from the outer edge, continuous at both edges. Source: science.md §8 "Stick".
 * Cost: O(1).
 * @param radius |s|, 0..1 (or a normalised tilt). @throws never.
 * @example stickRateMagnitude(0.55, 0.15, 0.95, 2, 180) // 45
 */
export function stickRateMagnitude(radius: number, deadZone: number, outerEdge: number, exponent: number, maxRate: number): number {
  if (radius <= deadZone) return 0;
  if (radius >= outerEdge) return maxRate;
  const m = (radius - deadZone) / (outerEdge - deadZone);
  return positivePower(m, exponent) * maxRate;
}
