/** ID-1 card width, mm (ISO/IEC 7810: 85.60 × 53.98 mm). */
export const ID1_CARD_WIDTH_MM = 85.6;
/** ID-1 card height, mm (ISO/IEC 7810). */
export const ID1_CARD_HEIGHT_MM = 53.98;
/** Angle between fixation and the blind spot, degrees (Li et al. 2020, Scientific Reports 10:904). */
export const BLIND_SPOT_ANGLE_DEG = 13.5;

/**
 * Screen scale from the card match (pixelsPerMmFromCard).
 *
 * Purpose: the participant resizes an on-screen card until it matches a real ID-1 card held to
 * the screen; px/mm = width_px / 85.60. Measures CSS pixels, so it must be redone on zoom.
 * Source: Li, Joo, Yeatman & Reinecke 2020 (Sci. Rep. 10:904), card method; ISO/IEC 7810 ID-1.
 * Cost: O(1).
 * @throws Error "pixelsPerMmFromCard requires a positive card width in px" otherwise.
 * @example pixelsPerMmFromCard(323.5) // 3.779205607476635
 */
export function pixelsPerMmFromCard(cardWidthPx: number): number {
  if (!(cardWidthPx > 0) || !Number.isFinite(cardWidthPx)) throw new Error("pixelsPerMmFromCard requires a positive card width in px");
  return cardWidthPx / ID1_CARD_WIDTH_MM;
}

/**
 * Viewing distance by the blind-spot method (viewingDistanceFromBlindSpot).
 *
 * Purpose: with one eye closed and the other fixating a square, a dot moving away vanishes in
 * the blind spot; the mean of the repeats, s (mm on the screen), gives the distance
 * d = s / tan(13.5°). Source: Li et al. 2020, Sci. Rep. 10:904 (virtual chinrest). Cost: O(k).
 * @throws Error "viewingDistanceFromBlindSpot requires at least one distance" / "… a positive scale".
 * @example viewingDistanceFromBlindSpot([540], 4) // 562.3 (mm; 135 mm / tan 13.5°)
 */
export function viewingDistanceFromBlindSpot(distancesPx: readonly number[], pixelsPerMm: number): number {
  if (distancesPx.length === 0) throw new Error("viewingDistanceFromBlindSpot requires at least one distance");
  if (!(pixelsPerMm > 0)) throw new Error("viewingDistanceFromBlindSpot requires a positive scale");
  const meanPx = distancesPx.reduce((a, b) => a + b, 0) / distancesPx.length;
  return meanPx / pixelsPerMm / Math.tan((BLIND_SPOT_ANGLE_DEG * Math.PI) / 180);
}

/**
 * Visual angle to on-screen pixels (visualDegreesToPixels).
 *
 * Purpose: sizes in degrees of visual angle drawn at the calibrated scale and distance:
 * 2·d·tan(θ/2)·px/mm. Source: Li et al. 2020 (Sci. Rep. 10:904); standard visual-angle geometry.
 * Cost: O(1).
 * @throws Error "visualDegreesToPixels requires a positive distance and scale".
 * @example visualDegreesToPixels(1, 500, 4) // 34.90677... (8.7267 mm at 500 mm)
 */
export function visualDegreesToPixels(degrees: number, distanceMm: number, pixelsPerMm: number): number {
  if (!(distanceMm > 0) || !(pixelsPerMm > 0)) throw new Error("visualDegreesToPixels requires a positive distance and scale");
  return 2 * distanceMm * Math.tan((degrees * Math.PI) / 360) * pixelsPerMm;
}

/** The calibration results a session uses for drawing. */
export interface DisplayCalibration {
  pixelsPerMm: number | null;
  viewingDistanceMm: number | null;
}

/**
 * CSS pixels per task unit for one sequence (pixelsPerTaskUnit).
 *
 * Purpose: cursor-mode tasks in px, mm or visual degrees; for degrees the scale is taken from
 * the sequence's amplitude, so A is exact on the screen (2·d·tan(A/2)·px/mm ÷ A).
 * Source: Li et al. 2020 (Sci. Rep. 10:904). Cost: O(1).
 * @throws Error "pixelsPerTaskUnit: mm needs the card calibration" (or "… visual degrees need the card and blind-spot calibrations").
 * @example pixelsPerTaskUnit("mm", 100, { pixelsPerMm: 4, viewingDistanceMm: null }) // 4
 */
export function pixelsPerTaskUnit(unit: "px" | "mm" | "deg-visual" | "deg-view", amplitude: number, cal: DisplayCalibration): number {
  if (unit === "px" || unit === "deg-view") return 1;
  if (cal.pixelsPerMm === null) throw new Error("pixelsPerTaskUnit: mm needs the card calibration");
  if (unit === "mm") return cal.pixelsPerMm;
  if (cal.viewingDistanceMm === null) throw new Error("pixelsPerTaskUnit: visual degrees need the card and blind-spot calibrations");
  return visualDegreesToPixels(amplitude, cal.viewingDistanceMm, cal.pixelsPerMm) / amplitude;
}

/** The trial table's unit for a design unit: px, mm or deg. */
export function trialUnit(unit: "px" | "mm" | "deg-visual" | "deg-view"): "px" | "mm" | "deg" {
  return unit === "px" ? "px" : unit === "mm" ? "mm" : "deg";
}
