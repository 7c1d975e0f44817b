/**
 * The effective-width factor 4.133 ≈ √(2πe): a normal distribution of SD σ has the entropy of a
 * uniform one of width σ·√(2πe), and ±2.066σ holds 96 % of selections (ISO 9241-9:2000 Annex B;
 * ISO 9241-411:2012; Soukoreff & MacKenzie 2004). The standards print 4.133.
 */
export const EFFECTIVE_WIDTH_FACTOR = 4.133;

/**
 * Effective width We = 4.133·SDx from the sample SD of the signed end-point deviations dx along the
 * task axis (ISO 9241-411:2012; Soukoreff & MacKenzie 2004, IJHCS 61:751–789).
 *
 * Cost: O(1).
 * @throws Error when sdx is negative or not finite.
 * @example effectiveWidth(10) // 41.33
 */
export function effectiveWidth(sdx: number): number {
  if (!(sdx >= 0) || !Number.isFinite(sdx)) throw new Error(`effectiveWidth requires a non-negative SD, got ${sdx}`);
  return EFFECTIVE_WIDTH_FACTOR * sdx;
}
