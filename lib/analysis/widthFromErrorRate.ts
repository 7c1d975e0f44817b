import { jStat } from "../stats/jstat";

/**
 * Effective width from the error rate alone, for legacy data without selection coordinates
 * (MacKenzie 1992, HCI 7:91–139; formula from memory): We = W·2.066/z(1 − E/2), z the standard
 * normal quantile (jstat); for E ≤ 0.0049 % (a percentage: 0.000049 as a fraction) We = 0.5089·W.
 * Results computed this way are flagged `widthMethod: "errorRate"`.
 *
 * Cost: O(1).
 * @throws Error when width ≤ 0 or the error rate is outside [0, 1).
 * @example widthFromErrorRate(32, 0.04) // 32.19… (1.006·W)
 */
export function widthFromErrorRate(width: number, errorRate: number): number {
  if (!(width > 0)) throw new Error(`widthFromErrorRate requires a positive width, got ${width}`);
  if (!(errorRate >= 0 && errorRate < 1)) throw new Error(`widthFromErrorRate requires an error rate in [0, 1), got ${errorRate}`);
  if (errorRate <= 0.000049) return 0.5089 * width;
  return (width * 2.066) / jStat.normal.inv(1 - errorRate / 2, 0, 1);
}
