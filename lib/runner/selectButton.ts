import type { TransferConfig } from "@/lib/motion/config";

/**
 * The controller button that selects (selectButtonFor).
 *
 * Purpose: "button" selection uses the lowest button number not taken by the clutch, aim or
 * recenter controls of the condition (with the defaults 0, 1, 2: button 3). Source: W3C Gamepad
 * standard mapping (buttons 0–16). Cost: O(1).
 * @throws never.
 * @example selectButtonFor({ clutchButton: 0, aimButton: 1, recenterButton: 2 }) // 3
 */
export function selectButtonFor(c: Pick<TransferConfig, "clutchButton" | "aimButton" | "recenterButton">): number {
  const used = new Set([c.clutchButton, c.aimButton, c.recenterButton]);
  let b = 0;
  while (used.has(b)) b++;
  return b;
}
