/**
 * The view's vertical field of view in view mode (degrees): the participant's task draws with it,
 * and the design page's fit check (lib/study/checks) asks whether a ring lies within it. One
 * value for both. 60° is our choice for hand-held screens (common practice puts first-person
 * views at 50–70° vertical; from memory).
 */
export const VIEW_VERTICAL_FOV_DEG = 60;

/**
 * Screen position of a direction seen from a rotated view (projectDirection).
 *
 * Purpose: view mode draws targets at angular positions (yaw right, pitch up, degrees) with a
 * pinhole perspective projection for a camera turned to (viewYaw, viewPitch): the direction is
 * rotated into the camera frame (yaw about the vertical, then pitch) and projected with focal
 * length f = (H/2)/tan(vfov/2). Writes CSS px (y down) into `out`; returns false when the
 * direction is behind the camera. Source: standard pinhole projection (as in three.js's
 * PerspectiveCamera). Cost: O(1), no allocation.
 * @throws never.
 * @example projectDirection(0, 0, 0, 0, 60, 800, 600, out); [out.x, out.y] // [400, 300]
 */
export function projectDirection(
  yawDeg: number, pitchDeg: number, viewYawDeg: number, viewPitchDeg: number,
  verticalFovDeg: number, widthPx: number, heightPx: number, out: { x: number; y: number },
): boolean {
  const r = Math.PI / 180;
  const ty = yawDeg * r, tp = pitchDeg * r, vy = viewYawDeg * r, vp = viewPitchDeg * r;
  // direction: x right, y up, z forward
  const dx = Math.cos(tp) * Math.sin(ty), dy = Math.sin(tp), dz = Math.cos(tp) * Math.cos(ty);
  // undo the view's yaw (about y), then its pitch (about x)
  const x1 = dx * Math.cos(vy) - dz * Math.sin(vy);
  const z1 = dx * Math.sin(vy) + dz * Math.cos(vy);
  const y2 = dy * Math.cos(vp) - z1 * Math.sin(vp);
  const z2 = dy * Math.sin(vp) + z1 * Math.cos(vp);
  if (z2 <= 1e-6) return false;
  const f = heightPx / 2 / Math.tan((verticalFovDeg * r) / 2);
  out.x = widthPx / 2 + (f * x1) / z2;
  out.y = heightPx / 2 - (f * y2) / z2;
  return true;
}
