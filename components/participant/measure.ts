import type { MotionSample } from "@/lib/motion/sample";
import { createSampleMixer } from "@/lib/motion/sources/mixer";
import { createInputAgeLog, type InputAgeSummary } from "@/lib/runner/inputAge";
import { startMotionSource } from "./inputs";

/** What a short recording of the motion sensors gave. */
export interface MotionRecording {
  samples: MotionSample[];
  api: "generic-sensor" | "device-motion";
  requestedRateHz: number | null;
  /** Input age at drawing while recording (each sample to the next animation frame). */
  age: InputAgeSummary;
}

/** Records the motion sensors for `ms` milliseconds (the permission must be given already). */
export async function recordMotion(ms: number): Promise<MotionRecording> {
  const mixer = createSampleMixer("motion");
  const samples: MotionSample[] = [];
  const ages = createInputAgeLog();
  let raf = 0, running = true;
  let poll: ((nowMs: number) => void) | undefined;
  const frame = (): void => {
    const now = performance.now();
    poll?.(now);
    ages.drawn(now);
    if (running) raf = requestAnimationFrame(frame);
  };
  const started = await startMotionSource(window, (f) => {
    const s = mixer.accept(f);
    if (s) {
      samples.push(s);
      ages.arrived(mixer.lastInputMs);
    }
  });
  poll = started.source.poll?.bind(started.source);
  raf = requestAnimationFrame(frame);
  try {
    await new Promise((r) => setTimeout(r, ms));
  } finally {
    running = false;
    cancelAnimationFrame(raf);
    started.source.stop();
  }
  return { samples, api: started.api, requestedRateHz: started.requestedRateHz, age: ages.summary() };
}

/**
 * How often the controller reports new data, for `ms` milliseconds: new reports (a changed
 * `timestamp`, W3C Gamepad) per second, as the page sees them polling once per animation frame
 * (so at most the frame rate); null without a controller.
 */
export async function controllerReportRate(ms: number): Promise<number | null> {
  const { createGamepadSource, gamepadConnected } = await import("@/lib/motion/sources/gamepad");
  if (!gamepadConnected(window)) return null;
  const stamps: number[] = [];
  const pad = createGamepadSource(window, { selfDriven: true });
  await pad.start((f) => {
    if (f.inputMs !== undefined) stamps.push(f.inputMs);
  });
  await new Promise((r) => setTimeout(r, ms));
  pad.stop();
  const span = stamps.length > 1 ? stamps[stamps.length - 1]! - stamps[0]! : 0;
  return span > 0 ? Math.round(((stamps.length - 1) * 1000 * 10) / span) / 10 : null;
}
