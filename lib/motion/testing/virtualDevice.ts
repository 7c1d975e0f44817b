// Test support: a virtual hand-held device driven through known orientations with three.js
// (the reference library for rotations), producing the W3C DeviceMotion readings it would give.
// Imported by tests only (three is a dev dependency).
import { Quaternion, Vector3 } from "three";
import type { MotionSample } from "../sample";

export const STANDARD_GRAVITY = 9.80665;
/** World frame of the virtual room: z is the true vertical (up). */
export const WORLD_UP = new Vector3(0, 0, 1);

/** Orientation: device axes → world. Identity = lying flat, screen up, top edge pointing +y. */
export const flat = (): Quaternion => new Quaternion();
/** Upright, screen facing the user (who stands at world −y... looking along +y): device y = world up. */
export const upright = (): Quaternion => new Quaternion().setFromAxisAngle(new Vector3(1, 0, 0), Math.PI / 2);
/** Rotation about the true vertical by `deg` (positive = counter-clockwise seen from above = a left turn). */
export const aboutVertical = (deg: number): Quaternion => new Quaternion().setFromAxisAngle(WORLD_UP, (deg * Math.PI) / 180);
/** Rotation about a world axis by `deg`. */
export const aboutWorld = (axis: [number, number, number], deg: number): Quaternion =>
  new Quaternion().setFromAxisAngle(new Vector3(...axis).normalize(), (deg * Math.PI) / 180);
/** Rotation about a device axis by `deg` (apply as q·r). */
export const aboutDevice = aboutWorld;

/**
 * Samples of a device following `orientationAt(tMs)`: angular rate about the device axes (deg/s,
 * from the relative rotation between consecutive orientations, as a gyroscope measures it) and the
 * accelerometer's reading including gravity (the world "up" · g, seen in device axes).
 */
export function virtualDeviceSamples(
  orientationAt: (tMs: number) => Quaternion,
  durationMs: number,
  rateHz: number,
  extra: Partial<MotionSample> = {},
): MotionSample[] {
  const out: MotionSample[] = [];
  const period = 1000 / rateHz;
  let prev = orientationAt(0);
  for (let k = 0; k * period <= durationMs + 1e-9; k++) {
    const t = k * period;
    const q = orientationAt(t);
    const rel = prev.clone().invert().multiply(q); // body-frame increment
    if (rel.w < 0) rel.set(-rel.x, -rel.y, -rel.z, -rel.w);
    const angle = 2 * Math.acos(Math.min(1, rel.w));
    const s = Math.sin(angle / 2);
    const dt = k === 0 ? 1 : period / 1000;
    const rate = k === 0 || s < 1e-12 ? [0, 0, 0] : [rel.x / s, rel.y / s, rel.z / s].map((a) => (a * angle * 180) / Math.PI / dt);
    const g = WORLD_UP.clone().applyQuaternion(q.clone().invert()).multiplyScalar(STANDARD_GRAVITY);
    out.push({ tMs: t, gyroX: rate[0] as number, gyroY: rate[1] as number, gyroZ: rate[2] as number, accelX: g.x, accelY: g.y, accelZ: g.z, ...extra });
    prev = q;
  }
  return out;
}

/** Sum of an engine's outputs over a stream. */
export function totalOutput(push: (s: MotionSample) => { dx: number; dy: number } | null, samples: readonly MotionSample[]): { x: number; y: number } {
  let x = 0, y = 0;
  for (const s of samples) {
    const o = push(s);
    if (o) {
      x += o.dx;
      y += o.dy;
    }
  }
  return { x, y };
}
