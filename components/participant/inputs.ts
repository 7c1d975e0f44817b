import type { TransferConfig } from "@/lib/motion/config";
import type { MotionSample } from "@/lib/motion/sample";
import { createSampleMixer } from "@/lib/motion/sources/mixer";
import { createDeviceMotionSource } from "@/lib/motion/sources/deviceMotion";
import { createGamepadSource } from "@/lib/motion/sources/gamepad";
import type { SampleSource } from "@/lib/motion/sources/types";
import type { Point } from "@/lib/task/point";

/** What a sequence's input needs to know (the simulated source plans its movements from it). */
export interface SequenceInputRequest {
  /** Target centres in selection order, in the engine's output units (cursor: canvas px, y down; view: deg, y up). */
  targets: Point[];
  amplitude: number;
  width: number;
  config: TransferConfig;
  selectButton: number;
}

/** A motion input for the session: live sensors, or (test builds only) the simulated participant. */
export interface InputProvider {
  readonly kind: "device-motion" | "scripted" | "none";
  /** Starts samples; `request` is given for a task sequence, absent for the checks (still device). */
  start(sink: (s: MotionSample) => void, request?: SequenceInputRequest): Promise<void>;
  stop(): void;
  /** Samples handed to the sink since the last start. */
  readonly delivered: number;
}

/**
 * The live provider: DeviceMotion (gyroscope + accelerometer, the clock) joined with a game
 * controller's stick and buttons when one is connected. `start` may ask for motion permission,
 * so the first call must come from a user gesture.
 */
export function createLiveProvider(win: Window, askPermission: boolean): InputProvider {
  let sources: SampleSource[] = [];
  let delivered = 0;
  return {
    kind: "device-motion",
    async start(sink) {
      delivered = 0;
      const mixer = createSampleMixer("motion");
      const accept = (f: Parameters<typeof mixer.accept>[0]): void => {
        const s = mixer.accept(f);
        if (s) {
          delivered++;
          sink(s);
        }
      };
      const motion = createDeviceMotionSource(win, { askPermission });
      await motion.start(accept);
      sources = [motion];
      if (typeof win.navigator.getGamepads === "function") {
        const pad = createGamepadSource(win);
        await pad.start(accept).catch(() => undefined);
        sources.push(pad);
      }
    },
    stop() {
      for (const s of sources) s.stop();
      sources = [];
    },
    get delivered() {
      return delivered;
    },
  };
}
