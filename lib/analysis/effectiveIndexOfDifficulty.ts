/**
 * Effective index of difficulty IDe = log2(Ae/We + 1) bits, Shannon form (MacKenzie 1992,
 * HCI 7:91–139; ISO 9241-411:2012). Infinite when We = 0.
 *
 * Cost: O(1).
 * @throws Error when ae < 0 or we < 0.
 * @example effectiveIndexOfDifficulty(254, 31.9) // 3.1636…
 */
export function effectiveIndexOfDifficulty(ae: number, we: number): number {
  if (!(ae >= 0)) throw new Error(`effectiveIndexOfDifficulty requires a non-negative Ae, got ${ae}`);
  if (!(we >= 0)) throw new Error(`effectiveIndexOfDifficulty requires a non-negative We, got ${we}`);
  return Math.log2(ae / we + 1);
}
