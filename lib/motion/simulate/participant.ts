import { z } from "zod";
import { parseTransferConfig, type TransferConfig, type TransferConfigInput } from "../config";
import { createMotionEngine, usesChannel, type MotionEngine } from "../engine";
import type { Vec3 } from "../frames/gravityEstimate";
import type { MotionSample } from "../sample";
import { tiltForwardDeg, tiltSidewaysDeg } from "../stick/tiltAngles";
import { splitCoarseFine } from "./channelShare";
import { deviceRatesForViewRate, pointerForOutputStep, stickForViewRate, tiltUpForViewRate } from "./inverseTransfer";
import { fittsMovementTimeMs, minimumJerkFraction } from "./minimumJerk";
import { createSeededRandom } from "./prng";
import { sensorProfiles, type SensorProfile } from "./sensorProfiles";
import type { TrialRow } from "./trialRow";

const point = z.object({ x: z.number().finite(), y: z.number().finite() });

/**
 * One sequence for the simulated participant: target centres in visiting order (n + 1
 * selections give n movements; the first only starts the clock), nominal A and W, all in the
 * engine's output units (cursor mode: px, y down; view mode: degrees, x = yaw right, y = pitch up).
 */
export const simulatedSequenceTaskSchema = z.object({
  targets: z.array(point).min(2, "needs at least 2 targets"),
  amplitude: z.number().finite().positive(),
  width: z.number().finite().positive(),
  participant: z.string().default("sim01"),
  condition: z.string().default("c1"),
  block: z.number().int().min(0).default(1),
  sequence: z.number().int().min(0).default(1),
});
export type SimulatedSequenceTask = z.input<typeof simulatedSequenceTaskSchema>;

const sensorSchema = z.object({
  rateHz: z.number().positive().max(2000),
  gyroNoiseSdDegPerS: z.number().min(0),
  gyroBiasDegPerS: z.object({ x: z.number().finite(), y: z.number().finite(), z: z.number().finite() }),
  accelNoiseSdMps2: z.number().min(0),
  quantumDegPerS: z.number().min(0),
  jitterSdMs: z.number().min(0),
});

/** How the simulated person moves and which sensor they hold. */
export const simulatedParticipantSchema = z.object({
  seed: z.number().int(),
  /** Fitts intercept a and slope b: MT = a + b·log2(A/W + 1) from selection to selection. */
  interceptMs: z.number().min(0).default(300),
  slopeMsPerBit: z.number().min(0).default(150),
  /** SD of the endpoint along (and across) the task axis, output units; default W/4.133 (We = W). */
  endpointSd: z.number().positive().optional(),
  /** SD of each movement time as a fraction of MT. */
  timingSdFraction: z.number().min(0).max(0.5).default(0.05),
  hold: z.enum(["upright", "flat"]).default("upright"),
  /** The motion sensor (motion techniques and tilt-rate). */
  sensor: z.union([z.enum(["phone", "controller"]), sensorSchema]).default("controller"),
  /** Still time before the first selection (for bias calibration), ms. */
  restMs: z.number().min(0).default(1500),
  /** Still time before each selection, ms (part of MT); default 100 + latency + 3·smoothing. */
  dwellMs: z.number().min(0).optional(),
  /** Button bit held on the sample of each selection (null: none, e.g. a tap or click selects). */
  selectButton: z.number().int().min(0).max(31).nullable().default(3),
  /** motion+stick and motion+touch: view speed (deg/s) above which the stick or the touch drag carries the movement; motion aims the rest. */
  coarseAboveDegPerS: z.number().positive().max(2000).default(30),
  /** Rate at which a gamepad is read (once per animation frame), Hz: the stick techniques' clock without motion. */
  gamepadRateHz: z.number().positive().max(1000).default(60),
  /** Rate of pointer events (coalesced), Hz: the mouse and touch-drag clock without motion. */
  pointerRateHz: z.number().positive().max(2000).default(120),
  /** Mouse movement comes in whole CSS pixels (Pointer Lock movementX/Y); 0 keeps fractions. */
  pointerQuantumPx: z.number().min(0).max(10).optional(),
  /** Touch in cursor mode: how long the finger stays down on a tap, ms. */
  tapMs: z.number().min(0).max(1000).default(80),
});
export type SimulatedParticipant = z.input<typeof simulatedParticipantSchema>;

/** A selection: time, where the cursor was, which target was aimed at. */
export interface SimulatedSelection {
  tMs: number;
  x: number;
  y: number;
  target: number;
  hit: boolean;
}

export interface SimulatedSequence {
  /**
   * The input stream, in the fields the live sources fill (replay format): gyroscope (deg/s, with
   * bias and noise) and accelerometer for motion and tilt-rate; stick axes for the stick
   * techniques; pointer movement (mouse, touch drag) or position (touch in cursor mode); buttons;
   * `selected` on each selection's sample.
   */
  samples: MotionSample[];
  selections: SimulatedSelection[];
  /** One row per movement (interfaces.md trial table). */
  trials: TrialRow[];
  /** The gyroscope bias that was added (what calibration should recover; zeros without a gyroscope). */
  sensorBiasDegPerS: { x: number; y: number; z: number };
  /** The planned endpoints (before the engine), one per movement. */
  intendedEndpoints: { x: number; y: number }[];
  /** Where the cursor (or view) starts: the first target; replay with `--start` at this point. */
  start: { x: number; y: number };
  /** Which clock the samples follow: the motion sensor, the gamepad, pointer events, or taps. */
  clock: "sensor" | "gamepad" | "pointer" | "taps";
}

const G = 9.80665;
const DEG = Math.PI / 180;
const noSensor: SensorProfile = { rateHz: 60, gyroNoiseSdDegPerS: 0, gyroBiasDegPerS: { x: 0, y: 0, z: 0 }, accelNoiseSdMps2: 0, quantumDegPerS: 0, jitterSdMs: 0.2 };

/**
 * Simulated participant for one sequence (simulateSequence).
 *
 * Purpose: produce the input a person would give through the condition's technique, and their
 * selections and trial rows: rest, then for each target a minimum-jerk movement from the current
 * cursor to an endpoint drawn around the target centre (normal, SD σ along and across the axis),
 * timed by Fitts' law with the Shannon ID, ending with a still dwell and a selection. The
 * intended path goes out through the technique's channels by the inverse of their transfer
 * functions: device rates (gyroscope, with the true "up" in the accelerometer, bias, noise,
 * coarsening and jitter) for motion; stick deflection for the stick (its movement time at least
 * what the stick's top rate allows); a flick to the rim for the heading stick (motion gives the
 * vertical); the fast part through the stick or the touch drag and the rest through motion for
 * motion+stick and motion+touch; pointer movement for the mouse (whole pixels) and a touch drag;
 * taps at the endpoint for touch in cursor mode; a held tilt for tilt-rate (closed loop on where
 * the input has taken the cursor, since tilt sets a rate). The selection point is where the
 * engine, fed the stream, puts the cursor — so a browser task driven by the same input logs the
 * same rows, and `npm run replay --start` reproduces them. Both display modes.
 * Source: science.md §9 (Flash & Hogan 1985 minimum jerk; Fitts/Shannon MT; We = 4.133σ);
 * science.md §8 (the transfer functions inverted). Cost: O(samples).
 * @throws Error for a heading stick without motion on targets that differ vertically, or a
 *   selection button that is also a control; ZodError / TransferConfigError for bad input.
 * @example simulateSequence({ targets: ring, amplitude: 400, width: 40 }, { technique: "stick", displayMode: "cursor" }, { seed: 7 }).trials.length // ring.length - 1
 */
export function simulateSequence(
  taskInput: SimulatedSequenceTask,
  configInput: TransferConfigInput | TransferConfig,
  participantInput: SimulatedParticipant,
): SimulatedSequence {
  const task = simulatedSequenceTaskSchema.parse(taskInput);
  const config = parseTransferConfig(configInput);
  const person = simulatedParticipantSchema.parse(participantInput);
  const t = config.technique;
  const motion = usesChannel(t, "motion"), tilt = usesChannel(t, "tilt"), stick = usesChannel(t, "stick"), pointer = usesChannel(t, "pointer");
  const headingStick = stick && config.stickMode === "heading";
  const deviceSensor = motion || tilt;
  const cursor = config.displayMode === "cursor";
  const taps = t === "touch" && cursor;
  const first = task.targets[0] as { x: number; y: number };
  if (headingStick && !motion && task.targets.some((p) => Math.abs(p.y - first.y) > 1e-9)) {
    throw new Error("simulateSequence: a heading stick without motion turns only horizontally, and these targets need vertical movement (use motion+stick, or a horizontal strip task)");
  }
  const selectMask = person.selectButton === null ? 0 : 2 ** person.selectButton;
  for (const [name, b] of [["clutchButton", config.clutchButton], ["aimButton", config.activation === "while-aiming" ? config.aimButton : null], ["recenterButton", config.recenterButton]] as const) {
    if (b !== null && b === person.selectButton) throw new Error(`simulateSequence: the selection button ${b} is also the configuration's ${name}`);
  }
  const sensor: SensorProfile = deviceSensor ? (typeof person.sensor === "string" ? sensorProfiles[person.sensor] : person.sensor) : noSensor;
  const clock: SimulatedSequence["clock"] = deviceSensor ? "sensor" : taps ? "taps" : stick ? "gamepad" : "pointer";
  const rateHz = deviceSensor ? sensor.rateHz : stick ? person.gamepadRateHz : person.pointerRateHz;
  const pointerQuantum = person.pointerQuantumPx ?? (t === "mouse" ? 1 : 0);

  const rng = createSeededRandom(person.seed);
  const engine = createMotionEngine(config);
  // tilt sets a rate, so the person steers by where the input has taken the cursor (before any added latency)
  const feel: MotionEngine | null = tilt ? createMotionEngine({ ...config, addedLatencyMs: 0 }) : null;
  engine.setPosition(first.x, first.y);
  feel?.setPosition(first.x, first.y);
  const sigma = person.endpointSd ?? task.width / 4.133;
  const dwellMs = person.dwellMs ?? 100 + config.addedLatencyMs + 3 * config.smoothingTimeMs;
  const unitsPerDeg = cursor ? config.pixelsPerDegree : 1;
  const yUp = cursor ? -1 : 1; // output y → view y (up)
  const periodMs = 1000 / rateHz;
  const aimMask = config.activation === "while-aiming" && config.aimButton !== null ? 2 ** config.aimButton : 0;

  // the device: its true "up" in device axes, and for tilt-rate the neutral hold
  const up: Vec3 = person.hold === "upright" ? { x: 0, y: 1, z: 0 } : { x: 0, y: 0, z: 1 };
  const neutral = { sideways: tiltSidewaysDeg(up.x), forward: tiltForwardDeg(up.y, up.z) };
  const omega: Vec3 = { x: 0, y: 0, z: 0 }, nextUp: Vec3 = { x: 0, y: 0, z: 0 }, split = { coarseX: 0, coarseY: 0, fineX: 0, fineY: 0 };
  const stickOut = { x: 0, y: 0 }, pointerOut = { x: 0, y: 0 };
  let pointerX = 0, pointerY = 0, pointerSentX = 0, pointerSentY = 0; // the mouse's whole-pixel position
  let feelX = first.x, feelY = first.y;

  const samples: MotionSample[] = [];
  const selections: SimulatedSelection[] = [];
  const trials: TrialRow[] = [];
  const intendedEndpoints: { x: number; y: number }[] = [];
  let cx = first.x, cy = first.y; // where the engine has put the cursor
  let k = 0, lastT = 0;

  const quantise = (v: number): number => (sensor.quantumDegPerS > 0 ? Math.round(v / sensor.quantumDegPerS) * sensor.quantumDegPerS : v);
  const nextTime = (): number => {
    const tt = Math.max(lastT + 0.1 * periodMs, k * periodMs + sensor.jitterSdMs * rng.normal());
    k++;
    return Math.round(tt * 1000) / 1000;
  };

  /** What a sample carries beyond the device's rotation: set per sample, then emitted. */
  interface Extra {
    stickX?: number;
    stickY?: number;
    pointerDx?: number;
    pointerDy?: number;
    pointerX?: number;
    pointerY?: number;
    selected?: number;
  }

  /** Emit one sample at time `tt`: the device turning at `omega` (deg/s, device axes) since the last one, or tilted to `nextUp`. */
  const emit = (tt: number, buttons: number, extra: Extra, tiltTo: Vec3 | null): void => {
    const dtS = samples.length === 0 ? 0 : (tt - lastT) / 1000;
    const s: MotionSample = { tMs: tt, gyroX: 0, gyroY: 0, gyroZ: 0, buttons: buttons | aimMask, ...extra };
    if (deviceSensor) {
      if (tiltTo) {
        // the rotation taking the old "up" to the new one, about their common perpendicular: the
        // device turns the opposite way (a world-fixed vector seen from the device turns as −ω)
        const ax = tiltTo.y * up.z - tiltTo.z * up.y, ay = tiltTo.z * up.x - tiltTo.x * up.z, az = tiltTo.x * up.y - tiltTo.y * up.x;
        const sin = Math.sqrt(ax * ax + ay * ay + az * az), cos = tiltTo.x * up.x + tiltTo.y * up.y + tiltTo.z * up.z;
        const angle = Math.atan2(sin, cos);
        const k0 = sin > 1e-12 && dtS > 0 ? angle / sin / dtS / DEG : 0;
        omega.x = ax * k0;
        omega.y = ay * k0;
        omega.z = az * k0;
        up.x = tiltTo.x;
        up.y = tiltTo.y;
        up.z = tiltTo.z;
      } else {
        // the true "up" seen from the turning device: dĝ/dt = ĝ × ω
        const wx = omega.x * DEG * dtS, wy = omega.y * DEG * dtS, wz = omega.z * DEG * dtS;
        const ux = up.x + (up.y * wz - up.z * wy), uy = up.y + (up.z * wx - up.x * wz), uz = up.z + (up.x * wy - up.y * wx);
        const un = Math.sqrt(ux * ux + uy * uy + uz * uz);
        up.x = ux / un;
        up.y = uy / un;
        up.z = uz / un;
      }
      s.gyroX = quantise(omega.x + sensor.gyroBiasDegPerS.x + sensor.gyroNoiseSdDegPerS * rng.normal());
      s.gyroY = quantise(omega.y + sensor.gyroBiasDegPerS.y + sensor.gyroNoiseSdDegPerS * rng.normal());
      s.gyroZ = quantise(omega.z + sensor.gyroBiasDegPerS.z + sensor.gyroNoiseSdDegPerS * rng.normal());
      s.accelX = G * up.x + sensor.accelNoiseSdMps2 * rng.normal();
      s.accelY = G * up.y + sensor.accelNoiseSdMps2 * rng.normal();
      s.accelZ = G * up.z + sensor.accelNoiseSdMps2 * rng.normal();
      s.screenAngleDeg = 0;
    }
    samples.push(s);
    lastT = tt;
    const o = engine.push(s);
    if (o) {
      cx += o.dx;
      cy += o.dy;
    }
    const f = feel?.push(s);
    if (f) {
      feelX += f.dx;
      feelY += f.dy;
    }
  };

  /** Mouse or drag movement for an output step (whole pixels for the mouse, the remainder carried). */
  const pointerStep = (dx: number, dy: number, extra: Extra): void => {
    pointerForOutputStep(config, dx, dy, pointerOut);
    pointerX += pointerOut.x;
    pointerY += pointerOut.y;
    const qx = pointerQuantum > 0 ? Math.round(pointerX / pointerQuantum) * pointerQuantum : pointerX;
    const qy = pointerQuantum > 0 ? Math.round(pointerY / pointerQuantum) * pointerQuantum : pointerY;
    extra.pointerDx = qx - pointerSentX;
    extra.pointerDy = qy - pointerSentY;
    pointerSentX = qx;
    pointerSentY = qy;
  };

  /**
   * One sample whose intended output over (lastT, tt] is (dx, dy), through the technique's
   * channels; for tilt-rate, the position the input should have reached (closed loop).
   */
  const step = (tt: number, dx: number, dy: number, aimX: number, aimY: number, buttons: number, extra: Extra): void => {
    const dtS = samples.length === 0 ? 0 : (tt - lastT) / 1000;
    omega.x = omega.y = omega.z = 0;
    if (dtS <= 0) return emit(tt, buttons, extra, tilt ? up : null);
    const vx = dx / unitsPerDeg / dtS, vy = (yUp * dy) / unitsPerDeg / dtS; // view deg/s, y up
    if (tilt) {
      const wx = (aimX - feelX) / unitsPerDeg / dtS, wy = (yUp * (aimY - feelY)) / unitsPerDeg / dtS;
      const slow = Math.hypot(wx, wy) < 0.5; // inside the dead zone's reach: hold neutral
      tiltUpForViewRate(config, slow ? 0 : wx, slow ? 0 : wy, neutral, nextUp);
      return emit(tt, buttons, extra, nextUp);
    }
    if (pointer && !motion) {
      pointerStep(dx, dy, extra);
      return emit(tt, buttons, extra, null);
    }
    if (stick && !headingStick && !motion) {
      stickForViewRate(config, vx, vy, stickOut);
      extra.stickX = stickOut.x;
      extra.stickY = stickOut.y;
      return emit(tt, buttons, extra, null);
    }
    let fx = vx, fy = vy;
    if ((stick && !headingStick) || pointer) {
      splitCoarseFine(vx, vy, person.coarseAboveDegPerS, stick ? 0.95 * config.stickMaxRateDegPerS : Infinity, split);
      fx = split.fineX;
      fy = split.fineY;
      if (stick) {
        stickForViewRate(config, split.coarseX, split.coarseY, stickOut);
        extra.stickX = stickOut.x;
        extra.stickY = stickOut.y;
      } else {
        pointerStep(split.coarseX * unitsPerDeg * dtS, yUp * split.coarseY * unitsPerDeg * dtS, extra);
      }
    }
    if (headingStick) fx = 0; // the heading stick turns; motion aims the vertical
    if (motion) deviceRatesForViewRate(config, fx, fy, up, omega);
    emit(tt, buttons, extra, null);
  };

  const still = (tt: number, buttons: number, extra: Extra = {}): void => step(tt, 0, 0, cx, cy, buttons, extra);

  if (taps) {
    // touch in cursor mode: the finger lands where the person aims, and the cursor is there
    const tap = (downAt: number, upAt: number, x: number, y: number): void => {
      if (upAt - downAt > 0) emit(downAt, 0, { pointerX: x, pointerY: y }, null);
      emit(upAt, selectMask, { pointerX: x, pointerY: y, selected: 1 }, null);
    };
    tap(Math.max(0, person.restMs - person.tapMs), person.restMs, first.x, first.y);
  } else {
    // rest, then the first selection (it only starts the clock)
    let tt = nextTime();
    still(tt, 0);
    while ((tt = nextTime()) < person.restMs) still(tt, 0);
    still(tt, selectMask, { selected: 1 });
  }
  selections.push({ tMs: lastT, x: cx, y: cy, target: 0, hit: Math.hypot(cx - first.x, cy - first.y) <= task.width / 2 });
  let prevSelT = lastT;

  const rateLimit = stick && !headingStick && !motion ? config.stickMaxRateDegPerS : tilt ? config.tiltMaxRateDegPerS : Infinity;
  for (let i = 1; i < task.targets.length; i++) {
    const target = task.targets[i] as { x: number; y: number };
    const from = task.targets[i - 1] as { x: number; y: number };
    const sx = cx, sy = cy;
    const ax = target.x - sx, ay = target.y - sy;
    const a = Math.hypot(ax, ay) || 1;
    const ux = ax / a, uy = ay / a;
    const along = sigma * rng.normal(), across = sigma * rng.normal();
    const ex = target.x + along * ux - across * uy, ey = headingStick && !motion ? sy : target.y + along * uy + across * ux;
    intendedEndpoints.push({ x: ex, y: ey });
    // a rate-limited channel cannot go faster than its top rate (minimum jerk peaks at 1.875·A/T)
    const fastestMs = rateLimit < Infinity ? (1000 * 1.875 * (Math.hypot(ex - sx, ey - sy) / unitsPerDeg)) / (0.95 * rateLimit) : 0;
    const mt = Math.max(dwellMs + 150, dwellMs + fastestMs, fittsMovementTimeMs(person.interceptMs, person.slopeMsPerBit, a, task.width) * (1 + person.timingSdFraction * rng.normal()));
    const moveMs = mt - dwellMs;
    const t0 = prevSelT, selAt = prevSelT + mt;
    if (taps) {
      emit(Math.max(t0 + 1, selAt - person.tapMs), 0, { pointerX: ex, pointerY: ey }, null);
      emit(selAt, selectMask, { pointerX: ex, pointerY: ey, selected: 1 }, null);
    } else {
      // the heading stick: a flick to the rim at the heading of the horizontal change, held for the turn
      const heading = headingStick ? (ex - sx) / unitsPerDeg : 0;
      if (Math.abs(heading) > 180) throw new Error("simulateSequence: a heading-stick turn of more than 180° in one movement");
      const flickUntil = t0 + config.headingTurnTimeMs + 2 * periodMs;
      let prevFrac = 0, tt = t0;
      for (;;) {
        tt = nextTime();
        const frac = minimumJerkFraction((tt - t0) / moveMs);
        const isSelection = tt >= selAt;
        const extra: Extra = isSelection ? { selected: 1 } : {};
        if (headingStick && tt <= flickUntil) {
          const h = (heading * Math.PI) / 180;
          extra.stickX = Math.sin(h);
          extra.stickY = -Math.cos(h);
        }
        step(tt, (frac - prevFrac) * (ex - sx), (frac - prevFrac) * (ey - sy), sx + frac * (ex - sx), sy + frac * (ey - sy), isSelection ? selectMask : 0, extra);
        prevFrac = frac;
        if (isSelection) break;
      }
    }
    const selT = lastT;
    const hit = Math.hypot(cx - target.x, cy - target.y) <= task.width / 2;
    selections.push({ tMs: selT, x: cx, y: cy, target: i, hit });
    trials.push({
      participant: task.participant, condition: task.condition, block: task.block, sequence: task.sequence, trial: i,
      amplitude: task.amplitude, width: task.width,
      from_x: from.x, from_y: from.y, to_x: target.x, to_y: target.y,
      start_x: sx, start_y: sy, end_x: cx, end_y: cy,
      time_ms: Math.round((selT - prevSelT) * 1000) / 1000,
      hit: hit ? 1 : 0,
    });
    prevSelT = selT;
  }
  return { samples, selections, trials, sensorBiasDegPerS: { ...sensor.gyroBiasDegPerS }, intendedEndpoints, start: { ...first }, clock };
}
