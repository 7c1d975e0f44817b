/**
 * Screen-frame x component of a device-frame vector (screenFrameX).
 *
 * Purpose: DeviceMotion axes are fixed to the device's natural orientation; when the screen is
 * turned (`screen.orientation.angle` = θ, the device turned θ counter-clockwise), the screen's
 * right is the device direction (cos θ, −sin θ). Source: W3C Device Orientation and Motion
 * (device frame) and W3C Screen Orientation (`angle`, counter-clockwise). Cost: O(1).
 * @throws never.
 * @example screenFrameX(0, 1, 90) // -1 (device top points left when turned 90° counter-clockwise)
 */
export function screenFrameX(x: number, y: number, angleDeg: number): number {
  if (angleDeg === 0) return x;
  const a = (angleDeg * Math.PI) / 180;
  return x * Math.cos(a) - y * Math.sin(a);
}

/**
 * Screen-frame y component of a device-frame vector (screenFrameY).
 *
 * Purpose: see {@link screenFrameX}; the screen's up is the device direction (sin θ, cos θ).
 * Source: W3C Device Orientation and Motion; W3C Screen Orientation. Cost: O(1).
 * @throws never.
 * @example screenFrameY(1, 0, 90) // 1 (the device's right edge is on top)
 */
export function screenFrameY(x: number, y: number, angleDeg: number): number {
  if (angleDeg === 0) return y;
  const a = (angleDeg * Math.PI) / 180;
  return x * Math.sin(a) + y * Math.cos(a);
}
