import type { TransferConfig } from "@/lib/motion/config";
import { createMotionEngineFromValid } from "@/lib/motion/engineCore";
import type { MotionSample } from "@/lib/motion/sample";

/** Totals since the last reset: how far the device turned and how far the level moved the view or cursor. */
export interface MeterReading {
  /** Device rotation, integrated from the gyroscope (|ω|·Δt), degrees. */
  deviceDeg: number;
  /** Horizontal and vertical output: view degrees or cursor px. */
  dx: number;
  dy: number;
}

/**
 * A second engine at the level's settings, fed the same samples as the task, so the try page can
 * say "the device turned 30.1°, the cursor moved 602 px" (the same engine code, not a copy).
 */
export function createDisplacementMeter(config: TransferConfig) {
  const engine = createMotionEngineFromValid({ ...config, addedLatencyMs: 0 });
  const r: MeterReading = { deviceDeg: 0, dx: 0, dy: 0 };
  let lastT: number | null = null;
  return {
    push(s: MotionSample): void {
      const bx = s.gyroX - config.biasXDegPerS, by = s.gyroY - config.biasYDegPerS, bz = s.gyroZ - config.biasZDegPerS;
      if (lastT !== null && s.tMs > lastT) r.deviceDeg += (Math.hypot(bx, by, bz) * Math.min(s.tMs - lastT, config.maxSampleGapMs)) / 1000;
      lastT = s.tMs;
      const o = engine.push(s);
      if (o) {
        r.dx += o.dx;
        r.dy += o.dy;
      }
    },
    read(): MeterReading {
      return { ...r };
    },
    reset(): void {
      r.deviceDeg = 0;
      r.dx = 0;
      r.dy = 0;
    },
  };
}
