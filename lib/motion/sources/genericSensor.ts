import { currentScreenAngle } from "./deviceMotion";
import type { SampleSource } from "./types";

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

const DEG_PER_RAD = 180 / Math.PI;

/** Whether the Generic Sensor `Gyroscope` exists in this browser (Chromium). */
export function hasGenericGyroscope(win: Window): boolean {
  return typeof (win as unknown as { Gyroscope?: unknown }).Gyroscope === "function";
}

/**
 * Generic Sensor source (createGenericSensorSource).
 *
 * Purpose: higher sample rates than DeviceMotion where present (Chromium). `Gyroscope` reports
 * rad/s, converted here to deg/s; `Accelerometer` m/s² including gravity; `referenceFrame:
 * "device"` keeps the W3C device axes (the engine applies the screen angle). Source: W3C Generic
 * Sensor API, Gyroscope and Accelerometer specifications. Cost: one fragment per reading.
 * @throws Error from `start` when the sensors are missing or refused.
 * @example if (hasGenericGyroscope(window)) await createGenericSensorSource(window, 120).start(sink);
 */
export function createGenericSensorSource(win: Window, frequencyHz = 120): SampleSource {
  let gyro: XyzSensor | null = null, accel: XyzSensor | null = null;
  return {
    kind: "generic-sensor",
    async start(sink) {
      const w = win as unknown as { Gyroscope?: XyzSensorConstructor; Accelerometer?: XyzSensorConstructor };
      if (!w.Gyroscope) throw new Error("generic sensors: Gyroscope is not available");
      gyro = new w.Gyroscope({ frequency: frequencyHz, referenceFrame: "device" });
      if (w.Accelerometer) accel = new w.Accelerometer({ frequency: frequencyHz, referenceFrame: "device" });
      const g = gyro, a = accel;
      g.addEventListener("reading", () => {
        if (g.x === null || g.y === null || g.z === null) return;
        sink({
          tMs: g.timestamp ?? win.performance.now(),
          gyro: { x: g.x * DEG_PER_RAD, y: g.y * DEG_PER_RAD, z: g.z * DEG_PER_RAD },
          ...(a && a.x !== null && a.y !== null && a.z !== null ? { accel: { x: a.x, y: a.y, z: a.z } } : {}),
          screenAngleDeg: currentScreenAngle(win),
        });
      });
      await new Promise<void>((resolve, reject) => {
        g.addEventListener("activate", () => resolve(), { once: true });
        g.addEventListener("error", (e) => reject(new Error(`generic sensors: ${String((e as unknown as { error?: Error }).error?.message ?? "error")}`)), { once: true });
        g.start();
        a?.start();
      });
    },
    stop() {
      gyro?.stop();
      accel?.stop();
      gyro = null;
      accel = null;
    },
  };
}
