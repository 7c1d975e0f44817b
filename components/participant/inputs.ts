import type { Technique } from "@/lib/motion/config";
import type { MotionSample } from "@/lib/motion/sample";
import type { SampleFragment, SampleSource } from "@/lib/motion/sources/types";
import { createSampleMixer, type SampleMixer } from "@/lib/motion/sources/mixer";
import { inputPathsFor } from "@/lib/runner/inputPaths";
import type { InputApi } from "@/lib/runner/batch";

/** The Generic Sensor frequency asked for (Hz): browsers grant at most their sensor's maximum; the rate reached is measured. */
export const REQUESTED_SENSOR_HZ = 240;

/** What a task sequence's inputs need from the page. */
export interface TaskInputSpec {
  technique: Technique;
  displayMode: "cursor" | "view";
  /** The task area: pointer, drag and touch input is read over it. */
  surface: HTMLElement;
  /** A tap on the task area that moved no further than the slop (drag techniques with tap selection). */
  onTap?: (tMs: number) => void;
  /** A touch-down on the task area (direct touch), after its movement. */
  onTouchDown?: (tMs: number) => void;
  /** Pointer Lock taken or lost (mouse). */
  onLockChange?: (locked: boolean) => void;
}

/** The inputs of one sequence: every source its technique uses, joined into samples by one clock. */
export interface TaskInputs {
  /** The browser paths in use. */
  readonly apis: InputApi[];
  /** Generic Sensor: the frequency asked; else null. */
  readonly requestedRateHz: number | null;
  /** Mouse: raw (unadjusted) Pointer Lock movement, plain lock, or null before a lock. */
  readonly pointerLockRaw: boolean | null;
  /** Samples handed to the sink since start. */
  readonly delivered: number;
  /** Time stamp of the newest input event in the last sample (NaN: none new), for the input age. */
  readonly lastInputMs: number;
  start(sink: (s: MotionSample) => void): Promise<void>;
  /** Once per animation frame, before drawing: polls the controller (its clock for stick techniques) and fills quiet Generic Sensor gaps. */
  poll(nowMs: number): void;
  /** The on-screen and key controls held now, as controller button bits. */
  setControls(mask: number, tMs: number): void;
  /** A control pressed for one sample (a recenter). */
  pulse(mask: number, tMs: number): void;
  /**
   * Pointer clock only: hand the sink a sample now with no movement, for a selection made without
   * a pointer movement (a click), so that it happens on a sample of the stream. False (nothing
   * sent) for the other clocks, whose samples come often enough by themselves.
   */
  still(tMs: number): boolean;
  /** Mouse: ask for Pointer Lock (from a click). */
  lock(): Promise<boolean>;
  stop(): void;
}

/**
 * The motion source for this browser: the Generic Sensor API where it starts (Chromium; higher
 * rates), DeviceMotion otherwise (also when the generic sensors are refused or fail). Permission
 * for DeviceMotion where the browser asks for one (iOS) must already be given, from a gesture.
 */
export async function startMotionSource(win: Window, sink: (f: SampleFragment) => void): Promise<{ source: SampleSource & { poll?: (nowMs: number) => void }; api: "generic-sensor" | "device-motion"; requestedRateHz: number | null }> {
  const { hasGenericGyroscope, createGenericSensorSource } = await import("@/lib/motion/sources/genericSensor");
  if (hasGenericGyroscope(win)) {
    const generic = createGenericSensorSource(win, REQUESTED_SENSOR_HZ);
    try {
      await generic.start(sink);
      return { source: generic, api: "generic-sensor", requestedRateHz: REQUESTED_SENSOR_HZ };
    } catch {
      generic.stop(); // refused or no such sensor here: DeviceMotion may still work
    }
  }
  const { createDeviceMotionSource } = await import("@/lib/motion/sources/deviceMotion");
  const motion = createDeviceMotionSource(win, { askPermission: false });
  await motion.start(sink);
  return { source: motion, api: "device-motion", requestedRateHz: null };
}

/**
 * The inputs of one task sequence (openTaskInputs): the sources of the technique's input paths
 * (lib/runner/inputPaths.ts), each module loaded only when a study uses it, joined by the
 * technique's clock.
 */
export function openTaskInputs(win: Window, spec: TaskInputSpec): TaskInputs {
  const paths = inputPathsFor(spec.technique, spec.displayMode);
  const mixer: SampleMixer = createSampleMixer(paths.clock);
  const sources: SampleSource[] = [];
  const apis: InputApi[] = [];
  let requestedRateHz: number | null = null;
  const pollers: Array<{ poll(nowMs: number): void }> = [];
  let lockSource: { readonly unadjusted: boolean | null; lock(): Promise<boolean> } | null = null;
  let sink: ((s: MotionSample) => void) | null = null;
  let delivered = 0, stopped = false;

  const accept = (f: SampleFragment): void => {
    if (stopped || !sink) return;
    const s = mixer.accept(f);
    if (s) {
      delivered++;
      sink(s);
    }
  };

  return {
    get apis() {
      return apis;
    },
    get requestedRateHz() {
      return requestedRateHz;
    },
    get pointerLockRaw() {
      return lockSource ? lockSource.unadjusted : null;
    },
    get delivered() {
      return delivered;
    },
    get lastInputMs() {
      return mixer.lastInputMs;
    },
    async start(s) {
      sink = s;
      if (paths.motion) {
        const m = await startMotionSource(win, accept);
        if (stopped) return void m.source.stop();
        sources.push(m.source);
        if (m.source.poll) pollers.push(m.source as { poll(nowMs: number): void });
        apis.push(m.api);
        requestedRateHz = m.requestedRateHz;
      }
      if (typeof win.navigator.getGamepads === "function" && (paths.gamepad === "required" || paths.clock === "motion")) {
        const { createGamepadSource, gamepadConnected } = await import("@/lib/motion/sources/gamepad");
        if (paths.gamepad === "required" || gamepadConnected(win)) {
          const g = createGamepadSource(win, { stick: "right" });
          await g.start(accept);
          sources.push(g);
          pollers.push(g);
          apis.push("gamepad");
        }
      }
      if (paths.pointer === "lock") {
        const { createPointerLockSource } = await import("@/lib/motion/sources/pointerLock");
        const src = createPointerLockSource(spec.surface, { onLockChange: spec.onLockChange });
        await src.start(accept);
        sources.push(src);
        lockSource = src;
        apis.push("pointer-lock");
      } else if (paths.pointer === "drag") {
        const { createPointerDragSource } = await import("@/lib/motion/sources/pointerDrag");
        const src = createPointerDragSource(spec.surface, spec.onTap ? { tapSlopPx: 10, onTap: spec.onTap } : {});
        await src.start(accept);
        sources.push(src);
        apis.push("touch-drag");
      } else if (paths.pointer === "direct") {
        const { createTouchDirectSource } = await import("@/lib/motion/sources/pointerDrag");
        const src = createTouchDirectSource(spec.surface, spec.onTouchDown);
        await src.start(accept);
        sources.push(src);
        apis.push("touch-direct");
      }
      if (stopped) for (const src of sources) src.stop();
    },
    poll(nowMs) {
      for (const p of pollers) p.poll(nowMs);
    },
    setControls(mask, tMs) {
      accept({ tMs, controls: mask });
    },
    pulse(mask, tMs) {
      accept({ tMs, pulse: mask });
    },
    still(tMs) {
      if (paths.clock !== "pointer" || stopped || !sink) return false;
      accept({ tMs, pointer: { dx: 0, dy: 0 } });
      return true;
    },
    async lock() {
      if (!lockSource) return false;
      const ok = await lockSource.lock();
      // without a lock the mouse still moves the cursor by its plain movement over the task area
      if (!ok && !apis.includes("pointer-move")) apis.push("pointer-move");
      return ok;
    },
    stop() {
      stopped = true;
      for (const src of sources) src.stop();
      sources.length = 0;
      sink = null;
    },
  };
}
