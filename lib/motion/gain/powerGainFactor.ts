import { positivePower } from "./positivePower";

/**
 * Power-curve gain factor (powerGainFactor).
 *
 * Purpose: output speed ∝ speed^p, i.e. gain factor (s/s_ref)^(p − 1): below the reference speed
 * small rotations are reduced, above it fast ones are amplified (p ≥ 1). Source: power-law
 * transfer functions (Casiez & Roussel, UIST 2011). Cost: O(1).
 * @throws never.
 * @example powerGainFactor(7.5, 30, 2) // 0.25
 */
export function powerGainFactor(speed: number, referenceSpeed: number, exponent: number): number {
  if (exponent === 1) return 1;
  return positivePower(speed / referenceSpeed, exponent - 1);
}
