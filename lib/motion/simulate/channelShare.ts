/**
 * Share a view rate between a coarse and a fine channel (splitCoarseFine).
 *
 * Purpose: with motion+stick or motion+touch a person turns fast with the stick or the touch
 * drag and aims with the device (common practice: stick or touch for coarse turns, motion for
 * fine aim). The part of the speed above `coarseAbove` (deg/s) goes to the coarse channel, at
 * most `coarseMax`, in the rate's direction; the rest stays fine, so the two always add up to
 * the rate. Writes `out`. Cost: O(1).
 * @throws never.
 * @example splitCoarseFine(100, 0, 30, Infinity, out); [out.coarseX, out.fineX] // [70, 30]
 */
export function splitCoarseFine(
  rateX: number,
  rateY: number,
  coarseAbove: number,
  coarseMax: number,
  out: { coarseX: number; coarseY: number; fineX: number; fineY: number },
): void {
  const speed = Math.sqrt(rateX * rateX + rateY * rateY);
  const coarse = speed > coarseAbove ? Math.min(speed - coarseAbove, coarseMax) : 0;
  const k = speed > 0 ? coarse / speed : 0;
  out.coarseX = rateX * k;
  out.coarseY = rateY * k;
  out.fineX = rateX - out.coarseX;
  out.fineY = rateY - out.coarseY;
}
