// The motion-aim engine without validation: only type imports of the configuration schema.
import type { TransferConfig } from "./config";
import { createDelayLine } from "./delayLine";
import { adaptiveFrameHorizontal } from "./frames/adaptiveFrame";
import { deviceFrameHorizontal } from "./frames/deviceFrame";
import { updateGravityEstimate, type Vec3 } from "./frames/gravityEstimate";
import { gravityFrameHorizontal, gravityFrameVertical } from "./frames/gravityFrame";
import { screenFrameX, screenFrameY } from "./frames/screenFrame";
import { speedAfterDeadBand } from "./gain/deadBand";
import { exponentialSmoothingFactor, fineAimDirectWeight } from "./gain/fineAimSmoothing";
import { gainAtSpeed } from "./gain/gainAtSpeed";
import type { MotionSample } from "./sample";
import { stickHeadingDeg, wrapAngleDeg } from "./stick/stickHeading";
import { stickRateMagnitude } from "./stick/stickRate";
import { tiltForwardDeg, tiltSidewaysDeg } from "./stick/tiltAngles";
import { isValidSample } from "./sampleValidity";

/**
 * One output step. View mode: `dx` = yaw change in degrees, positive to the right; `dy` = pitch
 * change in degrees, positive up. Cursor mode: `dx`, `dy` in CSS px, y down positive (page
 * coordinates). `recentered` is true on the sample where the recenter button was pressed.
 */
export interface MotionOutput {
  dx: number;
  dy: number;
  recentered: boolean;
}

/** The stateful motion-aim engine: one per participant × condition stream. */
export interface MotionEngine {
  readonly config: TransferConfig;
  /**
   * Feed one sample. Returns the output step (the same object every call: copy what you keep),
   * or null when the sample is invalid (NaN, infinite, missing field, time going backwards):
   * such a sample is counted in `dropped` and leaves the state unchanged.
   */
  push(sample: MotionSample): Readonly<MotionOutput> | null;
  /** Samples accepted and dropped so far. */
  readonly accepted: number;
  readonly dropped: number;
  /** Output steps released early because the added-latency queue was full. */
  readonly latencyOverflows: number;
  /** Whether motion input currently moves the view (not clutched, and active). */
  readonly motionActive: boolean;
  /** Copy the current "up" estimate (unit vector, device axes) into `out`. */
  readUp(out: Vec3): void;
  /** The same as pressing the recenter button: new tilt reference, smoothing and snap turn reset. */
  recenter(): void;
  /** Back to the state of a new engine. */
  reset(): void;
}

/** Capacity of the added-latency queue (entries): 1000 ms at up to 4 kHz. */
export const LATENCY_QUEUE_CAPACITY = 4096;



/** The engine's hot-path sample check (the same function as `isValidSample`, without the schema module). */
export const sampleIsUsable = isValidSample;

/**
 * Create a motion-aim engine from a configuration that is already validated
 * (createMotionEngineFromValid).
 *
 * Purpose: the engine of {@link createMotionEngine} without the validation step, so a browser
 * bundle that receives configurations the server has already validated (and defaulted) does not
 * carry the schema library. Turns input samples into view or cursor deltas with the configured
 * transfer function: bias removal → screen frame → reference frame (device / gravity / adaptive)
 * → dead band → gain curve with H/V multipliers → fine-aim smoothing → clutch and activation;
 * plus tilt-rate, stick (rate or snap-turn) and pointer channels by technique; then pixels per
 * degree (cursor mode) and added latency. Source: science.md §7–8 (W3C axes; Casiez & Roussel
 * 2011 CD gain). Cost: O(1) per sample, no allocation in `push`.
 * @throws never itself; a configuration that did not pass `parseTransferConfig` gives undefined
 *   behaviour (use {@link createMotionEngine} for unchecked input).
 * @example const e = createMotionEngineFromValid(parseTransferConfig({ gain: 6 })); e.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }); e.push({ tMs: 100, gyroX: 0, gyroY: 30, gyroZ: 0 })?.dx // -18
 */
export function createMotionEngineFromValid(c: TransferConfig): MotionEngine {
  const motionChannel = c.technique === "motion" || c.technique === "motion+stick" || c.technique === "motion+touch";
  const tiltChannel = c.technique === "tilt-rate";
  const stickChannel = c.technique === "stick" || c.technique === "motion+stick";
  const pointerChannel = c.technique === "motion+touch" || c.technique === "mouse" || c.technique === "touch";
  const needUp = tiltChannel || (motionChannel && c.frame !== "device");
  const cursor = c.displayMode === "cursor";
  const clutchMask = c.clutchButton === null ? 0 : 2 ** c.clutchButton;
  const aimMask = c.aimButton === null ? 0 : 2 ** c.aimButton;
  const recenterMask = c.recenterButton === null ? 0 : 2 ** c.recenterButton;
  const gravityTauS = c.gravityFilterTimeMs / 1000;
  const delay = createDelayLine(LATENCY_QUEUE_CAPACITY);
  const out: MotionOutput = { dx: 0, dy: 0, recentered: false };
  const up: Vec3 = { x: 0, y: 0, z: 1 };

  let accepted = 0, dropped = 0;
  let hasTime = false, lastT = 0;
  let upReady = false;
  let prevButtons = 0, clutchLatched = false, active = true;
  let smoothX = 0, smoothY = 0;
  let tiltRefSet = false, tiltRefSideways = 0, tiltRefForward = 0;
  let atRim = false, rimHeading = 0, pendingTurn = 0, pendingMs = 0;
  let cachedAngle = 0, cosA = 1, sinA = 0;

  const bit = (buttons: number, mask: number): boolean => mask !== 0 && Math.floor(buttons / mask) % 2 === 1;

  function doRecenter(): void {
    tiltRefSet = false;
    smoothX = 0;
    smoothY = 0;
    pendingTurn = 0;
    pendingMs = 0;
    atRim = false;
  }

  function reset(): void {
    accepted = 0;
    dropped = 0;
    hasTime = false;
    lastT = 0;
    upReady = false;
    up.x = 0;
    up.y = 0;
    up.z = 1;
    prevButtons = 0;
    clutchLatched = false;
    active = true;
    doRecenter();
    delay.clear();
  }

  function push(s: MotionSample): Readonly<MotionOutput> | null {
    if (!sampleIsUsable(s) || (hasTime && s.tMs < lastT)) {
      dropped++;
      return null;
    }
    accepted++;
    const rawDtMs = hasTime ? s.tMs - lastT : 0;
    const dtMs = rawDtMs > c.maxSampleGapMs ? c.maxSampleGapMs : rawDtMs;
    const dtS = dtMs / 1000;
    hasTime = true;
    lastT = s.tMs;
    out.recentered = false;

    // buttons: clutch (hold/toggle), activation, recenter (rising edge)
    const buttons = s.buttons ?? 0;
    const clutchDown = bit(buttons, clutchMask);
    if (c.clutchMode === "toggle" && clutchDown && !bit(prevButtons, clutchMask)) clutchLatched = !clutchLatched;
    const clutched = c.clutchMode === "hold" ? clutchDown : clutchLatched;
    active = !clutched && (c.activation === "always" || bit(buttons, aimMask));
    if (bit(buttons, recenterMask) && !bit(prevButtons, recenterMask)) {
      doRecenter();
      out.recentered = true;
    }
    prevButtons = buttons;

    // bias removal (device axes), then the "up" estimate (device axes)
    const wx = s.gyroX - c.biasXDegPerS, wy = s.gyroY - c.biasYDegPerS, wz = s.gyroZ - c.biasZDegPerS;
    if (needUp) {
      const ax = s.accelX, ay = s.accelY, az = s.accelZ;
      if (!upReady && ax !== undefined && ay !== undefined && az !== undefined) {
        const n = Math.sqrt(ax * ax + ay * ay + az * az);
        if (n > 1e-6) {
          up.x = ax / n;
          up.y = ay / n;
          up.z = az / n;
          upReady = true;
        }
      } else {
        updateGravityEstimate(up, wx, wy, wz, ax ?? NaN, ay ?? NaN, az ?? NaN, dtS, gravityTauS);
      }
    }

    // screen frame (screenFrameX/Y, with the angle's cosine and sine cached)
    const angle = s.screenAngleDeg ?? 0;
    if (angle !== cachedAngle) {
      cachedAngle = angle;
      cosA = screenFrameX(1, 0, angle);
      sinA = screenFrameY(1, 0, angle);
    }
    const rx = wx * cosA - wy * sinA, ry = wx * sinA + wy * cosA, rz = wz;
    const ux = up.x * cosA - up.y * sinA, uy = up.x * sinA + up.y * cosA, uz = up.z;

    let viewX = 0, viewY = 0; // view degrees, y up
    if (motionChannel) {
      let h: number, v: number;
      if (c.frame === "device") {
        h = deviceFrameHorizontal(ry, rz, c.deviceHorizontalAxis);
        v = rx;
      } else if (c.frame === "gravity") {
        h = gravityFrameHorizontal(rx, ry, rz, ux, uy, uz);
        v = gravityFrameVertical(rx, ry, rz, ux, uy, uz);
      } else {
        h = adaptiveFrameHorizontal(ry, rz, uy, uz);
        v = rx;
      }
      // Turning left (positive about "up") moves left; tilting the top edge away from the viewer
      // (negative about x, right-hand rule) moves up, as a camera would (science.md §8 "Signs").
      const rateX = -h, rateY = c.invertVertical ? v : -v;
      const speed = Math.sqrt(rateX * rateX + rateY * rateY);
      const reduced = speedAfterDeadBand(speed, c.deadBandDegPerS);
      const scale = speed > 0 ? reduced / speed : 0;
      const g = gainAtSpeed(c, reduced) * scale;
      let ox = g * c.horizontalGainMultiplier * rateX;
      let oy = g * c.verticalGainMultiplier * rateY;
      if (active) {
        if (c.smoothingTimeMs > 0) {
          const alpha = exponentialSmoothingFactor(dtMs, c.smoothingTimeMs);
          smoothX += alpha * (ox - smoothX);
          smoothY += alpha * (oy - smoothY);
          const w = fineAimDirectWeight(reduced, c.smoothingSpeedDegPerS);
          ox = w * ox + (1 - w) * smoothX;
          oy = w * oy + (1 - w) * smoothY;
        }
        viewX = ox * dtS;
        viewY = oy * dtS;
      } else {
        smoothX = 0;
        smoothY = 0;
      }
    }
    if (tiltChannel) {
      const sideways = tiltSidewaysDeg(ux), forward = tiltForwardDeg(uy, uz);
      if (!tiltRefSet) {
        tiltRefSideways = sideways;
        tiltRefForward = forward;
        tiltRefSet = true;
      }
      const tx = -(sideways - tiltRefSideways), ty = wrapAngleDeg(forward - tiltRefForward);
      const mag = Math.sqrt(tx * tx + ty * ty);
      if (active && mag > 0) {
        const rate = stickRateMagnitude(mag / c.tiltMaxDeg, c.tiltDeadZoneDeg / c.tiltMaxDeg, 1, c.tiltExponent, c.tiltMaxRateDegPerS);
        viewX += (rate * tx * dtS) / mag;
        viewY += (rate * ty * dtS) / mag;
      }
    }
    if (stickChannel) {
      const sx = s.stickX ?? 0, sy = s.stickY ?? 0;
      const r = Math.sqrt(sx * sx + sy * sy);
      if (c.stickMode === "rate") {
        if (r > 0) {
          const rate = stickRateMagnitude(r, c.stickDeadZone, c.stickOuterEdge, c.stickExponent, c.stickMaxRateDegPerS);
          viewX += (rate * sx * dtS) / r;
          viewY -= (rate * sy * dtS) / r;
        }
      } else {
        if (r >= c.snapTurnThreshold) {
          const heading = stickHeadingDeg(sx, sy);
          if (!atRim) {
            pendingTurn += heading;
            pendingMs = c.snapTurnDurationMs;
            atRim = true;
          } else {
            viewX += wrapAngleDeg(heading - rimHeading);
          }
          rimHeading = heading;
        } else {
          atRim = false;
        }
        if (pendingTurn !== 0) {
          if (pendingMs <= dtMs) {
            viewX += pendingTurn;
            pendingTurn = 0;
            pendingMs = 0;
          } else {
            const part = (pendingTurn * dtMs) / pendingMs;
            viewX += part;
            pendingTurn -= part;
            pendingMs -= dtMs;
          }
        }
      }
    }
    let x: number, y: number;
    if (cursor) {
      x = viewX * c.pixelsPerDegree;
      y = -viewY * c.pixelsPerDegree;
      if (pointerChannel) {
        x += (s.pointerDx ?? 0) * c.pointerCursorGain;
        y += (s.pointerDy ?? 0) * c.pointerCursorGain;
      }
    } else {
      x = viewX;
      y = viewY;
      if (pointerChannel) {
        x += (s.pointerDx ?? 0) * c.pointerDegreesPerPixel;
        y -= (s.pointerDy ?? 0) * c.pointerDegreesPerPixel;
      }
    }
    if (c.addedLatencyMs > 0) {
      delay.enqueue(s.tMs, x, y);
      delay.release(s.tMs, c.addedLatencyMs, out);
    } else {
      out.dx = x;
      out.dy = y;
    }
    return out;
  }

  return {
    config: c,
    push,
    get accepted() {
      return accepted;
    },
    get dropped() {
      return dropped;
    },
    get latencyOverflows() {
      return delay.overflows;
    },
    get motionActive() {
      return active;
    },
    readUp(target) {
      target.x = up.x;
      target.y = up.y;
      target.z = up.z;
    },
    recenter: doRecenter,
    reset,
  };
}
