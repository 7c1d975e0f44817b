import type { SequenceLayout } from "./geometry";

/** Whether a layout fits a drawing area, and if not what could help. */
export type FitVerdict = { fits: true } | { fits: false; advice: "rotate" | "larger-screen"; neededPx: { width: number; height: number } };

/** Space left free around the targets (CSS px), so no target touches the edge. */
export const FIT_MARGIN_PX = 8;

/**
 * Whether a cursor-mode layout fits the task area (layoutFit).
 *
 * Purpose: before a sequence, refuse to draw targets off-screen. The ring needs its outer
 * diameter (the ring's diameter D plus one width W) and the strip pair its span (A + W) across,
 * at `pixelsPerUnit`, plus a margin each side. When the area turned by 90° would hold it, the
 * advice is to rotate the device; else to use a larger screen. The area turned is `turned` when
 * given (the caller's estimate: the window's sides swapped, less the page's own bars, which do not
 * turn with it), else the area's sides swapped. (View mode has no such check: the
 * participant turns the view to find the targets.) Source: ISO 9241-411 task layout (ring
 * diameter D = A / cos(π/(2n)); strips A apart). Cost: O(targets).
 * @throws never.
 * @example layoutFit(sequenceLayout("ring", 13, 600, 60), 1, 412, 700) // { fits: false, advice: "larger-screen", … }
 */
export function layoutFit(layout: SequenceLayout, pixelsPerUnit: number, widthPx: number, heightPx: number, turned?: { width: number; height: number }): FitVerdict {
  let halfW = 0, halfH = 0;
  const r = (layout.width * pixelsPerUnit) / 2;
  for (const t of layout.all) {
    halfW = Math.max(halfW, Math.abs(t.x * pixelsPerUnit) + r);
    if (layout.type === "ring") halfH = Math.max(halfH, Math.abs(t.y * pixelsPerUnit) + r);
  }
  const needW = 2 * (halfW + FIT_MARGIN_PX), needH = layout.type === "ring" ? 2 * (halfH + FIT_MARGIN_PX) : 0;
  if (needW <= widthPx && needH <= heightPx) return { fits: true };
  const neededPx = { width: Math.ceil(needW), height: Math.ceil(needH) };
  const t = turned ?? { width: heightPx, height: widthPx };
  return { fits: false, advice: needW <= t.width && needH <= t.height ? "rotate" : "larger-screen", neededPx };
}
