import { speedAfterDeadBand } from "../gain/deadBand";
import type { StageWork } from "./work";

/**
 * The dead-band stage (deadBandStep): drop slow rotation, keep the rest continuous.
 *
 * Purpose: the device speed √(h² + v²) is reduced by the dead band ({@link speedAfterDeadBand}),
 * the rate keeps its direction; `speed` is left for the gain curve and fine-aim smoothing.
 * Source: science.md §8 (speed s, then gain G(s)). Cost: O(1).
 * @throws never.
 * @example work.rateX = 12; work.rateY = 0; deadBandStep(work, { deadBandDegPerS: 2 }); work.rateX // 10
 */
export function deadBandStep(work: StageWork, p: { deadBandDegPerS: number }): void {
  const deadBandDegPerS = p.deadBandDegPerS;
  const x = work.rateX, y = work.rateY;
  const speed = Math.sqrt(x * x + y * y);
  if (deadBandDegPerS > 0) {
    const reduced = speedAfterDeadBand(speed, deadBandDegPerS);
    const scale = speed > 0 ? reduced / speed : 0;
    work.rateX = x * scale;
    work.rateY = y * scale;
    work.speed = reduced;
  } else {
    work.speed = speed;
  }
}
