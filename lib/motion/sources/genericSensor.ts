import { currentScreenAngle } from "./deviceMotion";
import type { SampleFragment, SampleSource } from "./types";

/** The parts of the Generic Sensor API used here (not in TypeScript's DOM library). */
interface XyzSensor extends EventTarget {
  x: number | null;
  y: number | null;
  z: number | null;
  timestamp: number | null;
  start(): void;
  stop(): void;
}
type XyzSensorConstructor = new (options: { frequency: number; referenceFrame?: "device" | "screen" }) => XyzSensor;
type SensorWindow = { Gyroscope?: XyzSensorConstructor; Accelerometer?: XyzSensorConstructor; GravitySensor?: XyzSensorConstructor };

const DEG_PER_RAD = 180 / Math.PI;

/** Whether the Generic Sensor `Gyroscope` exists in this browser (Chromium). */
export function hasGenericGyroscope(win: Window): boolean {
  return typeof (win as unknown as SensorWindow).Gyroscope === "function";
}

/** The error a Generic Sensor reports, as a message (NotAllowedError, NotReadableError, …). */
function sensorError(e: Event): Error {
  const inner = (e as unknown as { error?: { name?: string; message?: string } }).error;
  const err = new Error(`generic sensors: ${inner?.name ?? "Error"}: ${inner?.message ?? "the sensor failed"}`);
  err.name = inner?.name ?? "Error";
  return err;
}

export interface GenericSensorSource extends SampleSource {
  /** Which sensor gives "up": the accelerometer (gravity included), the gravity sensor, or none. */
  readonly gravityFrom: "accelerometer" | "gravity-sensor" | null;
  /** Readings the sensor delivered (the stream also holds repeats that fill the gaps between them). */
  readonly readings: number;
  /** Call once per animation frame: fills the time since the last reading with the held reading (see below). */
  poll(nowMs: number): void;
}

/**
 * The reading period the gaps are filled at (ms): 60 Hz, the most Chromium grants a motion
 * sensor (it caps a larger `frequency` at 60 Hz) and DeviceMotion's rate.
 */
export const HELD_READING_PERIOD_MS = 1000 / 60;

/**
 * Generic Sensor source (createGenericSensorSource).
 *
 * Purpose: higher sample rates than DeviceMotion where present (Chromium): a `Gyroscope` at the
 * requested frequency (the browser grants at most its sensor's maximum; the rate actually
 * reached is measured by the caller), its readings converted from rad/s to deg/s, joined with the
 * latest `Accelerometer` reading (m/s², gravity included, like DeviceMotion's
 * accelerationIncludingGravity) or, without one, the `GravitySensor`. `referenceFrame: "device"`
 * keeps the W3C device axes (the engine applies the screen angle). Each gyroscope reading is
 * stamped with its own `timestamp` (the page's performance clock). Source: W3C Generic Sensor
 * API; W3C Gyroscope (rad/s); W3C Accelerometer and GravitySensor (m/s²). Cost: one fragment per
 * gyroscope reading.
 *
 * A Generic Sensor reports a new reading only when it differs enough from the last one (the
 * specification's "reading change threshold"; Chromium rounds the gyroscope to 0.1 deg/s), so a
 * device held still or turning at a steady rate may go quiet for a while, though its latest
 * reading stays true. An engine that integrates each sample's rate over the time since the
 * previous sample would then give the next reading's rate to the whole gap. So the gaps are
 * filled: when a reading arrives more than one and a half periods ({@link HELD_READING_PERIOD_MS})
 * after the last one (by the readings' own time stamps), the latest reading is first repeated at
 * each period it was held for (stamped then, as no new input); and `poll`, once per frame, fills
 * a quiet of more than three periods up to two periods before now (so the picture does not wait
 * for the next reading, while a reading that is only late to arrive keeps its place). The stream
 * stays regular at the sensor's rate and every stretch of time carries the rate the sensor
 * reported for it.
 * @throws Error from `start` when the sensors are missing, refused (NotAllowedError) or fail.
 * @example if (hasGenericGyroscope(window)) await createGenericSensorSource(window, 240).start(sink);
 */
export function createGenericSensorSource(win: Window, frequencyHz = 240): GenericSensorSource {
  let gyro: XyzSensor | null = null, up: XyzSensor | null = null;
  let gravityFrom: GenericSensorSource["gravityFrom"] = null;
  let sink: ((f: SampleFragment) => void) | null = null, readings = 0, lastT = NaN;
  let held: SampleFragment | null = null;
  /** Repeat the held reading at each period from the last sample to `untilMs`, when the gap is longer than `afterPeriods`, leaving `keepPeriods` free before `untilMs`. */
  const fill = (untilMs: number, afterPeriods: number, keepPeriods: number): void => {
    if (!held || !sink || !(untilMs - lastT > afterPeriods * HELD_READING_PERIOD_MS)) return;
    for (let t = lastT + HELD_READING_PERIOD_MS; t < untilMs - keepPeriods * HELD_READING_PERIOD_MS; t += HELD_READING_PERIOD_MS) {
      sink({ tMs: t, gyro: held.gyro, ...(held.accel ? { accel: held.accel } : {}), screenAngleDeg: held.screenAngleDeg });
      lastT = t;
    }
  };
  return {
    kind: "generic-sensor",
    get gravityFrom() {
      return gravityFrom;
    },
    get readings() {
      return readings;
    },
    poll(nowMs) {
      // only a long quiet (three periods): a reading merely late in arriving keeps its own time stamp
      fill(nowMs, 3, 2);
    },
    async start(s) {
      sink = s;
      readings = 0;
      lastT = NaN;
      held = null;
      const w = win as unknown as SensorWindow;
      if (!w.Gyroscope) throw new Error("generic sensors: Gyroscope is not available");
      gyro = new w.Gyroscope({ frequency: frequencyHz, referenceFrame: "device" });
      const UpSensor = w.Accelerometer ?? w.GravitySensor;
      gravityFrom = w.Accelerometer ? "accelerometer" : w.GravitySensor ? "gravity-sensor" : null;
      if (UpSensor) {
        try {
          up = new UpSensor({ frequency: frequencyHz, referenceFrame: "device" });
        } catch {
          up = null;
          gravityFrom = null;
        }
      }
      const g = gyro, a = up;
      g.addEventListener("reading", () => {
        if (g.x === null || g.y === null || g.z === null || !sink) return;
        const t = g.timestamp ?? win.performance.now();
        fill(t, 1.5, 0.5);
        const f: SampleFragment = {
          tMs: t,
          inputMs: t,
          gyro: { x: g.x * DEG_PER_RAD, y: g.y * DEG_PER_RAD, z: g.z * DEG_PER_RAD },
          ...(a && a.x !== null && a.y !== null && a.z !== null ? { accel: { x: a.x, y: a.y, z: a.z } } : {}),
          screenAngleDeg: currentScreenAngle(win),
        };
        readings++;
        held = f;
        lastT = t;
        sink(f);
      });
      await new Promise<void>((resolve, reject) => {
        g.addEventListener("activate", () => resolve(), { once: true });
        g.addEventListener("error", (e) => reject(sensorError(e)), { once: true });
        g.start();
        a?.start();
      });
    },
    stop() {
      gyro?.stop();
      up?.stop();
      gyro = null;
      up = null;
      sink = null;
      held = null;
    },
  };
}
