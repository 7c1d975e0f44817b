import type { StageWork } from "./work";

/**
 * The display-units stage (displayUnitsStep): view degrees → output units.
 *
 * Purpose: view mode keeps degrees (yaw right, pitch up); cursor mode multiplies by pixels per
 * degree and turns y to page coordinates (down). Reads `viewX/viewY`, writes `outX/outY`.
 * Source: docs/configuration.md "Technique and display" (cursor CD gain = gain × pixels per
 * degree). Cost: O(1).
 * @throws never.
 * @example work.viewX = 1; work.viewY = 2; displayUnitsStep(work, { cursor: true, pixelsPerDegree: 10 }); [work.outX, work.outY] // [10, -20]
 */
export function displayUnitsStep(work: StageWork, p: { cursor: boolean; pixelsPerDegree: number }): void {
  if (p.cursor) {
    work.outX = work.viewX * p.pixelsPerDegree;
    work.outY = -work.viewY * p.pixelsPerDegree;
  } else {
    work.outX = work.viewX;
    work.outY = work.viewY;
  }
}
