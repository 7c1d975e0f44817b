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
