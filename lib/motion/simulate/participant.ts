import { z } from "zod";
import { parseTransferConfig, type TransferConfig, type TransferConfigInput } from "../config";
import { createMotionEngine } from "../engine";
import type { Vec3 } from "../frames/gravityEstimate";
import type { MotionSample } from "../sample";
import { deviceRatesForViewRate } from "./inverseTransfer";
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
  sensor: z.union([z.enum(["phone", "controller"]), sensorSchema]).default("controller"),
  /** Still time before the first selection (for bias calibration), ms. */
  restMs: z.number().min(0).default(1500),
  /** Still time before each selection, ms (part of MT); default 100 + latency + 3·smoothing. */
  dwellMs: z.number().min(0).optional(),
  /** Button bit held on the sample of each selection (null: none). */
  selectButton: z.number().int().min(0).max(31).nullable().default(3),
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
  /** The raw sensor stream (replay format, gyroscope in deg/s with bias and noise). */
  samples: MotionSample[];
  selections: SimulatedSelection[];
  /** One row per movement (interfaces.md trial table). */
  trials: TrialRow[];
  /** The sensor bias that was added (what calibration should recover). */
  sensorBiasDegPerS: { x: number; y: number; z: number };
  /** The planned endpoints (before the engine), one per movement. */
  intendedEndpoints: { x: number; y: number }[];
}

const G = 9.80665;
const DEG = Math.PI / 180;

/**
 * Simulated participant for one sequence (simulateSequence).
 *
 * Purpose: produce the sensor stream a person would, and their selections and trial rows: rest,
 * then for each target a minimum-jerk movement from the current cursor to an endpoint drawn
 * around the target centre (normal, SD σ along and across the axis), timed by Fitts' law with
 * the Shannon ID, ending with a still dwell and a selection. Motion techniques get device rates
 * through the inverse of the configured transfer function (with the true "up" of a device that
 * pitches as it aims, gravity in the accelerometer, sensor bias, noise, coarsening and jitter);
 * mouse and touch techniques get pointer deltas. The selection point is where the engine, fed
 * the stream, puts the cursor — so a browser task driven by the same stream logs the same rows.
 * Source: science.md §9 (Flash & Hogan 1985 minimum jerk; Fitts/Shannon MT; We = 4.133σ).
 * Cost: O(samples).
 * @throws Error "simulateSequence supports motion, motion+touch, motion+stick, mouse and touch techniques" for stick or tilt-rate;
 *         ZodError / TransferConfigError for bad input.
 * @example simulateSequence({ targets: ring, amplitude: 400, width: 40 }, { displayMode: "cursor", gain: 3 }, { seed: 7 }).trials.length // ring.length - 1
 */
export function simulateSequence(
  taskInput: SimulatedSequenceTask,
  configInput: TransferConfigInput | TransferConfig,
  participantInput: SimulatedParticipant,
): SimulatedSequence {
  const task = simulatedSequenceTaskSchema.parse(taskInput);
  const config = parseTransferConfig(configInput);
  const person = simulatedParticipantSchema.parse(participantInput);
  const sensor: SensorProfile = typeof person.sensor === "string" ? sensorProfiles[person.sensor] : person.sensor;
  const pointerOnly = config.technique === "mouse" || config.technique === "touch";
  if (!pointerOnly && config.technique !== "motion" && config.technique !== "motion+touch" && config.technique !== "motion+stick") {
    throw new Error("simulateSequence supports motion, motion+touch, motion+stick, mouse and touch techniques");
  }
  const rng = createSeededRandom(person.seed);
  const engine = createMotionEngine(config);
  const sigma = person.endpointSd ?? task.width / 4.133;
  const dwellMs = person.dwellMs ?? 100 + config.addedLatencyMs + 3 * config.smoothingTimeMs;
  const cursor = config.displayMode === "cursor";
  const unitsPerDeg = cursor ? config.pixelsPerDegree : 1;
  const yUpSign = cursor ? -1 : 1; // output y → view y (up)
  const periodMs = 1000 / sensor.rateHz;
  const up: Vec3 = person.hold === "upright" ? { x: 0, y: 1, z: 0 } : { x: 0, y: 0, z: 1 };
  const omega: Vec3 = { x: 0, y: 0, z: 0 };

  const samples: MotionSample[] = [];
  const selections: SimulatedSelection[] = [];
  const trials: TrialRow[] = [];
  const intendedEndpoints: { x: number; y: number }[] = [];
  const first = task.targets[0] as { x: number; y: number };
  let cx = first.x, cy = first.y; // where the engine has put the cursor
  let k = 0, lastT = 0;

  const quantise = (v: number): number => (sensor.quantumDegPerS > 0 ? Math.round(v / sensor.quantumDegPerS) * sensor.quantumDegPerS : v);
  const nextTime = (): number => {
    const t = Math.max(lastT + 0.1 * periodMs, k * periodMs + sensor.jitterSdMs * rng.normal());
    k++;
    return Math.round(t * 1000) / 1000;
  };

  /** Emit one sample whose intended output over (lastT, t] is (dx, dy); returns the time. */
  const step = (t: number, dx: number, dy: number, buttons: number): void => {
    const dtMs = samples.length === 0 ? 0 : t - lastT;
    const s: MotionSample = { tMs: t, gyroX: 0, gyroY: 0, gyroZ: 0, buttons };
    if (pointerOnly) {
      const gain = cursor ? config.pointerCursorGain : config.pointerDegreesPerPixel;
      s.pointerDx = dx / gain;
      s.pointerDy = (cursor ? dy : -dy) / gain;
      omega.x = omega.y = omega.z = 0;
    } else if (dtMs > 0) {
      deviceRatesForViewRate(config, (dx / unitsPerDeg) / (dtMs / 1000), ((yUpSign * dy) / unitsPerDeg) / (dtMs / 1000), up, omega);
    } else {
      omega.x = omega.y = omega.z = 0;
    }
    // the true "up" seen from the turning device: dĝ/dt = ĝ × ω
    const dtS = dtMs / 1000;
    const wx = omega.x * DEG * dtS, wy = omega.y * DEG * dtS, wz = omega.z * DEG * dtS;
    const ux = up.x + (up.y * wz - up.z * wy), uy = up.y + (up.z * wx - up.x * wz), uz = up.z + (up.x * wy - up.y * wx);
    const un = Math.sqrt(ux * ux + uy * uy + uz * uz);
    up.x = ux / un;
    up.y = uy / un;
    up.z = uz / un;
    if (!pointerOnly) {
      s.gyroX = quantise(omega.x + sensor.gyroBiasDegPerS.x + sensor.gyroNoiseSdDegPerS * rng.normal());
      s.gyroY = quantise(omega.y + sensor.gyroBiasDegPerS.y + sensor.gyroNoiseSdDegPerS * rng.normal());
      s.gyroZ = quantise(omega.z + sensor.gyroBiasDegPerS.z + sensor.gyroNoiseSdDegPerS * rng.normal());
      s.accelX = G * up.x + sensor.accelNoiseSdMps2 * rng.normal();
      s.accelY = G * up.y + sensor.accelNoiseSdMps2 * rng.normal();
      s.accelZ = G * up.z + sensor.accelNoiseSdMps2 * rng.normal();
    }
    s.screenAngleDeg = 0;
    samples.push(s);
    lastT = t;
    const o = engine.push(s);
    if (o) {
      cx += o.dx;
      cy += o.dy;
    }
  };

  // rest, then the first selection (it only starts the clock)
  let t = nextTime();
  step(t, 0, 0, 0);
  while ((t = nextTime()) < person.restMs) step(t, 0, 0, 0);
  const selectMask = person.selectButton === null ? 0 : 2 ** person.selectButton;
  step(t, 0, 0, selectMask);
  let prevSelT = t;
  selections.push({ tMs: samples[samples.length - 1]?.tMs ?? t, x: cx, y: cy, target: 0, hit: Math.hypot(cx - first.x, cy - first.y) <= task.width / 2 });

  for (let i = 1; i < task.targets.length; i++) {
    const target = task.targets[i] as { x: number; y: number };
    const from = task.targets[i - 1] as { x: number; y: number };
    const sx = cx, sy = cy;
    const ax = target.x - sx, ay = target.y - sy;
    const a = Math.hypot(ax, ay) || 1;
    const ux = ax / a, uy = ay / a;
    const along = sigma * rng.normal(), across = sigma * rng.normal();
    const ex = target.x + along * ux - across * uy, ey = target.y + along * uy + across * ux;
    intendedEndpoints.push({ x: ex, y: ey });
    const mt = Math.max(dwellMs + 150, fittsMovementTimeMs(person.interceptMs, person.slopeMsPerBit, a, task.width) * (1 + person.timingSdFraction * rng.normal()));
    const moveMs = mt - dwellMs;
    const t0 = prevSelT, selAt = prevSelT + mt;
    let prevFrac = 0;
    for (;;) {
      t = nextTime();
      const frac = minimumJerkFraction((t - t0) / moveMs);
      const isSelection = t >= selAt;
      step(t, (frac - prevFrac) * (ex - sx), (frac - prevFrac) * (ey - sy), isSelection ? selectMask : 0);
      prevFrac = frac;
      if (isSelection) break;
    }
    const selT = samples[samples.length - 1]?.tMs ?? t;
    const hit = Math.hypot(cx - target.x, cy - target.y) <= task.width / 2;
    selections.push({ tMs: selT, x: cx, y: cy, target: i, hit });
    trials.push({
      participant: task.participant, condition: task.condition, block: task.block, sequence: task.sequence, trial: i,
      amplitude: task.amplitude, width: task.width,
      from_x: from.x, from_y: from.y, to_x: target.x, to_y: target.y,
      start_x: sx, start_y: sy, end_x: cx, end_y: cy,
      time_ms: Math.round((selT - (selections[i - 1]?.tMs ?? 0)) * 1000) / 1000,
      hit: hit ? 1 : 0,
    });
    prevSelT = t;
  }
  return { samples, selections, trials, sensorBiasDegPerS: { ...sensor.gyroBiasDegPerS }, intendedEndpoints };
}
