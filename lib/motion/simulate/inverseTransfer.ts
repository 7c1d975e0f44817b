import type { TransferConfig } from "../config";
import { gainAtSpeed } from "../gain/gainAtSpeed";
import type { Vec3 } from "../frames/gravityEstimate";

/**
 * Device speed that yields an output speed (deviceSpeedForOutputSpeed).
 *
 * Purpose: invert the speed map s ↦ G(s − d)·(s − d) of the gain curve and dead band, which is
 * increasing for every curve of the configuration (constant, two-level, power with p ≥ 1), by
 * closed form (constant gain) or bisection. Source: science.md §8. Cost: O(1), ≤ 200 steps.
 * @throws never; 0 for a zero output speed.
 * @example deviceSpeedForOutputSpeed({ ...defaultTransferConfig, gain: 6 }, 180) // 30
 */
export function deviceSpeedForOutputSpeed(config: TransferConfig, outputSpeed: number): number {
  if (!(outputSpeed > 0)) return 0;
  const out = (s: number): number => gainAtSpeed(config, s) * s;
  let reduced: number;
  if (config.gainCurve === "constant") {
    reduced = outputSpeed / config.gain;
  } else {
    let lo = 0, hi = 1;
    while (out(hi) < outputSpeed && hi < 1e9) hi *= 2;
    for (let i = 0; i < 100 && hi - lo > 1e-12 * hi; i++) {
      const mid = (lo + hi) / 2;
      if (out(mid) < outputSpeed) lo = mid;
      else hi = mid;
    }
    reduced = (lo + hi) / 2;
  }
  return reduced + config.deadBandDegPerS;
}

/**
 * Device angular rates that make the engine turn the view at a given rate (deviceRatesForViewRate).
 *
 * Purpose: the simulated participant's "hand": for a wanted view rate (deg/s, x right, y up)
 * returns the rates about the device axes (deg/s, W3C axes, screen angle 0) that the configured
 * frame, gain curve, dead band and H/V multipliers map onto it, for a device whose "up" is `up`.
 * Rotation is about the axis the frame reads: the true vertical for the gravity and adaptive
 * frames, the configured device axis for the device frame. Source: inverse of science.md §8.
 * Cost: O(1). Writes into `out`.
 * @throws never.
 * @example deviceRatesForViewRate(presetConfig("phone-upright", { gain: 6 }), -180, 0, { x: 0, y: 1, z: 0 }, out); out.y // 30 (a left turn)
 */
export function deviceRatesForViewRate(config: TransferConfig, viewRateX: number, viewRateY: number, up: Vec3, out: Vec3): void {
  const qx = viewRateX / config.horizontalGainMultiplier, qy = viewRateY / config.verticalGainMultiplier;
  const q = Math.sqrt(qx * qx + qy * qy);
  out.x = 0;
  out.y = 0;
  out.z = 0;
  if (q === 0) return;
  const s = deviceSpeedForOutputSpeed(config, q);
  const rateX = (qx / q) * s, rateY = (qy / q) * s;
  const h = -rateX, v = config.invertVertical ? rateY : -rateY;
  if (config.frame === "device") {
    out.x = v;
    const axis = config.deviceHorizontalAxis === "both" ? (Math.abs(up.y) >= Math.abs(up.z) ? "screen-up" : "screen-normal") : config.deviceHorizontalAxis;
    if (axis === "screen-up") out.y = h;
    else out.z = h;
  } else if (config.frame === "adaptive") {
    out.x = v;
    const n = Math.sqrt(up.y * up.y + up.z * up.z);
    if (n < 1e-6) out.z = h;
    else {
      out.y = (h * up.y) / n;
      out.z = (h * up.z) / n;
    }
  } else {
    const rx = 1 - up.x * up.x, ry = -up.x * up.y, rz = -up.x * up.z;
    const rn = Math.sqrt(rx * rx + ry * ry + rz * rz) || 1;
    out.x = h * up.x + (v * rx) / rn;
    out.y = h * up.y + (v * ry) / rn;
    out.z = h * up.z + (v * rz) / rn;
  }
}

/**
 * Stick deflection that makes the stick channel turn the view at a given rate (stickForViewRate).
 *
 * Purpose: the simulated participant's thumb for rate control: the inverse of the radial dead
 * zone and curve of science.md §8 "Stick": for a view rate of magnitude q ≤ max, the radius
 * r = r0 + (q/max)^(1/p)·(r1 − r0) along the wanted direction; W3C Gamepad standard mapping, so
 * looking up is a negative y (flipped again with `invertVertical`). A rate above the stick's top
 * rate is clipped to it. Writes `out.x`, `out.y` (−1..1). Cost: O(1).
 * @throws never; (0, 0) for a zero rate.
 * @example stickForViewRate(defaultTransferConfig, 0, 45, out); out.y // −0.55 (45 of 180 deg/s up, p = 2)
 */
export function stickForViewRate(config: TransferConfig, viewRateX: number, viewRateY: number, out: { x: number; y: number }): void {
  const q = Math.sqrt(viewRateX * viewRateX + viewRateY * viewRateY);
  out.x = 0;
  out.y = 0;
  if (q === 0) return;
  const share = Math.min(1, q / config.stickMaxRateDegPerS);
  const r = config.stickDeadZone + Math.pow(share, 1 / config.stickExponent) * (config.stickOuterEdge - config.stickDeadZone);
  out.x = (viewRateX / q) * r;
  out.y = (-viewRateY / q) * r * (config.invertVertical ? -1 : 1);
}

/**
 * Pointer movement that gives an output step (pointerForOutputStep).
 *
 * Purpose: the simulated participant's mouse or dragging finger: the inverse of the pointer
 * channel (cursor mode: `pointerCursorGain` px per px, page y down; view mode:
 * `pointerDegreesPerPixel`, a drag up looking up, flipped with `invertVertical`). Writes
 * `out.x`, `out.y` in CSS px. Source: docs/configuration.md "Pointer". Cost: O(1).
 * @throws never.
 * @example pointerForOutputStep({ ...defaultTransferConfig, pointerDegreesPerPixel: 0.2 }, 2, 1, out); [out.x, out.y] // [10, −5]
 */
export function pointerForOutputStep(config: TransferConfig, dx: number, dy: number, out: { x: number; y: number }): void {
  const cursor = config.displayMode === "cursor";
  const gain = cursor ? config.pointerCursorGain : config.pointerDegreesPerPixel;
  out.x = dx / gain;
  out.y = (cursor ? dy : -dy) / gain / (config.invertVertical ? -1 : 1);
}

/**
 * The hold that makes tilt-rate turn the view at a given rate (tiltUpForViewRate).
 *
 * Purpose: the simulated participant's wrist for tilt-rate: the inverse of the tilt channel —
 * tilt magnitude dz + (q/max)^(1/p)·(tiltMax − dz) in the wanted direction from the reference
 * hold (lowering the right edge turns right, tilting the top edge away turns up), as the unit
 * "up" vector in device axes (screen angle 0): up = (sin s, cos s·sin f, cos s·cos f) for the
 * sideways angle s and the forward angle f. A rate above the top rate is clipped to it; a zero
 * rate gives the reference hold itself. Writes `out`. Cost: O(1).
 * @param reference the neutral hold's sideways and forward angles, degrees.
 * @throws never.
 * @example tiltUpForViewRate(defaultTransferConfig, 0, 0, { sideways: 0, forward: 90 }, out); out.y // 1 (upright)
 */
export function tiltUpForViewRate(config: TransferConfig, viewRateX: number, viewRateY: number, reference: { sideways: number; forward: number }, out: Vec3): void {
  const q = Math.sqrt(viewRateX * viewRateX + viewRateY * viewRateY);
  let sideways = reference.sideways, forward = reference.forward;
  if (q > 0) {
    const share = Math.min(1, q / config.tiltMaxRateDegPerS);
    const mag = config.tiltDeadZoneDeg + Math.pow(share, 1 / config.tiltExponent) * (config.tiltMaxDeg - config.tiltDeadZoneDeg);
    sideways -= (viewRateX / q) * mag;
    forward -= (viewRateY / q) * mag * (config.invertVertical ? -1 : 1);
  }
  const s = (sideways * Math.PI) / 180, f = (forward * Math.PI) / 180;
  out.x = Math.sin(s);
  out.y = Math.cos(s) * Math.sin(f);
  out.z = Math.cos(s) * Math.cos(f);
}
