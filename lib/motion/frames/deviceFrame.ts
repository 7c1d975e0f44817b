/**
 * Horizontal rate in the device frame (deviceFrameHorizontal).
 *
 * Purpose: axes fixed to the device, the most consistent frame on hand-held screens (common
 * practice); horizontal input from the screen-normal axis z (natural held flat), the screen-up
 * axis y (natural held upright) or their sum. Source: science.md §8 "device". Cost: O(1).
 * @param rateY screen-frame rate about y, deg/s. @param rateZ rate about z, deg/s.
 * @throws never.
 * @example deviceFrameHorizontal(10, 3, "both") // 13
 */
export function deviceFrameHorizontal(rateY: number, rateZ: number, axis: "screen-normal" | "screen-up" | "both"): number {
  return axis === "screen-up" ? rateY : axis === "screen-normal" ? rateZ : rateY + rateZ;
}
