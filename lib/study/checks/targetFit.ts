import { FIT_MARGIN_PX } from "@/lib/runner/fit";
import { VIEW_VERTICAL_FOV_DEG } from "@/lib/runner/perspective";
import type { DeviceClass } from "./deviceClasses";

// The runner's own values (its view's vertical field of view; the clear space its fit check
// keeps around the ring, CSS px each side), so the design page checks what participants will see.
export { FIT_MARGIN_PX, VIEW_VERTICAL_FOV_DEG };

type TaskLike = { type: "ring" | "strip"; displayMode: "cursor" | "view"; unit: "px" | "mm" | "deg-visual" | "deg-view"; targetsPerRing: number };

/** Whether one A×W fits one device class, and how large its targets come out. */
export interface FitResult {
  amplitude: number;
  width: number;
  device: DeviceClass["id"];
  fits: boolean;
  /** Extent needed along the tightest direction, and what the screen offers (CSS px; view mode: degrees). */
  needed: number;
  available: number;
  /** The target's width on that screen, mm (null where the unit does not allow it). */
  targetMm: number | null;
}

/** CSS px per task unit on a device class (cursor mode). */
function pxPerUnit(unit: TaskLike["unit"], d: DeviceClass): number {
  switch (unit) {
    case "px": return 1;
    case "mm": return d.pixelsPerMm;
    // visual angle: 2·d·tan(θ/2) mm per θ, for 1° (Li et al. 2020; standard geometry)
    case "deg-visual": return 2 * d.viewingDistanceMm * Math.tan(Math.PI / 360) * d.pixelsPerMm;
    case "deg-view": return 1; // view degrees in cursor mode have no screen size; treated as px
  }
}

/**
 * Whether the targets of one A×W fit a screen (targetFit).
 *
 * Purpose: the design page warns before recruiting when a ring or strip would run off a
 * participant's screen. Ring (ISO 9241-411 multi-directional): the nominal A is the chord, so the
 * ring's diameter is D = A / cos(π/(2n)), and with the targets' own width the ring needs D + W
 * across the screen's smaller side. Strip (one-directional): A + W along the width. View mode:
 * targets are directions; the whole ring is in view at once when its angular extent is within
 * the runner's field of view (60° vertical; horizontal from the aspect ratio). Target size in mm
 * from the class's CSS px per mm (view mode: the target's width at the centre of a pinhole
 * projection, f = (H/2)/tan(fov/2)). Source: ISO 9241-411:2012 Annex B (ring geometry, via
 * science.md §1); standard perspective geometry. Cost: O(1).
 * @throws never.
 * @example targetFit({ type: "ring", displayMode: "cursor", unit: "px", targetsPerRing: 9 }, 480, 60, deviceClasses[0]).fits // false (D + W ≈ 547 px > 374 px)
 */
export function targetFit(task: TaskLike, amplitude: number, width: number, device: DeviceClass): FitResult {
  const n = task.targetsPerRing;
  const span = task.type === "ring" ? amplitude / Math.cos(Math.PI / (2 * n)) + width : amplitude + width;
  if (task.displayMode === "view") {
    const aspect = device.widthPx / device.heightPx;
    const vfov = VIEW_VERTICAL_FOV_DEG;
    const hfov = (2 * Math.atan(Math.tan((vfov * Math.PI) / 360) * aspect) * 180) / Math.PI;
    const available = task.type === "ring" ? Math.min(vfov, hfov) : hfov;
    const f = device.heightPx / 2 / Math.tan((vfov * Math.PI) / 360);
    const widthPx = 2 * f * Math.tan((width * Math.PI) / 360);
    return { amplitude, width, device: device.id, fits: span <= available, needed: span, available, targetMm: widthPx / device.pixelsPerMm };
  }
  const k = pxPerUnit(task.unit, device);
  const available = (task.type === "ring" ? Math.min(device.widthPx, device.heightPx) : device.widthPx) - 2 * FIT_MARGIN_PX;
  const needed = span * k;
  return { amplitude, width, device: device.id, fits: needed <= available, needed, available, targetMm: task.unit === "deg-view" ? null : (width * k) / device.pixelsPerMm };
}
