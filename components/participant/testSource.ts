// Test builds only: imported behind NEXT_PUBLIC_YAWPOINT_TEST_SOURCES, so normal builds drop it.
import { simulateSequence } from "@/lib/motion/simulate/participant";
import type { MotionSample } from "@/lib/motion/sample";
import type { InputProvider, SequenceInputRequest } from "./inputs";

/** The simulated participant's movement parameters used by the browser tests and benchmarks. */
export const SIMULATED_PERSON = { interceptMs: 200, slopeMsPerBit: 150, sensor: "phone" as const, restMs: 400 };

/**
 * The simulated participant as a motion source: for each sequence it plans the movements to
 * the given targets (lib/motion/simulate), then plays the sensor stream in real time, stamped
 * on the page's performance.now() clock. Without a request it plays a still device (checks).
 */
export function createSimulatedProvider(seed: number): InputProvider {
  let timer: ReturnType<typeof setTimeout> | null = null, delivered = 0, run = 0;
  const play = (samples: MotionSample[], sink: (s: MotionSample) => void): void => {
    const t0 = performance.now() + 20;
    let i = 0;
    const tick = (): void => {
      const now = performance.now();
      while (i < samples.length && t0 + samples[i]!.tMs <= now) {
        const s = samples[i++]!;
        delivered++;
        sink({ ...s, tMs: t0 + s.tMs });
      }
      if (i < samples.length) timer = setTimeout(tick, Math.max(0, Math.min(8, t0 + samples[i]!.tMs - now)));
      else timer = null;
    };
    timer = setTimeout(tick, 20);
  };
  return {
    kind: "scripted",
    async start(sink, request?: SequenceInputRequest) {
      delivered = 0;
      run++;
      if (request) {
        const sim = simulateSequence(
          { targets: request.targets, amplitude: request.amplitude, width: request.width },
          request.config,
          { seed: seed * 1000 + run, interceptMs: SIMULATED_PERSON.interceptMs, slopeMsPerBit: SIMULATED_PERSON.slopeMsPerBit, sensor: SIMULATED_PERSON.sensor, restMs: SIMULATED_PERSON.restMs, selectButton: request.selectButton },
        );
        play(sim.samples, sink);
      } else {
        const still = simulateSequence({ targets: [{ x: 0, y: 0 }, { x: 100, y: 0 }], amplitude: 100, width: 10 }, { displayMode: "cursor" }, { seed, sensor: SIMULATED_PERSON.sensor, restMs: 4000, selectButton: null });
        play(still.samples.filter((s) => s.tMs < 3900), sink);
      }
    },
    stop() {
      if (timer) clearTimeout(timer);
      timer = null;
    },
    get delivered() {
      return delivered;
    },
  };
}
