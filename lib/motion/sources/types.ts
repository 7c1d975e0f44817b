import type { MotionSample } from "../sample";

/**
 * A part of a sample, as one source knows it: a motion source has the gyroscope, a gamepad the
 * stick and buttons, a pointer source the deltas. {@link createSampleMixer} joins them.
 */
export interface SampleFragment {
  tMs: number;
  gyro?: { x: number; y: number; z: number };
  accel?: { x: number; y: number; z: number };
  stick?: { x: number; y: number };
  buttons?: number;
  pointer?: { dx: number; dy: number };
  screenAngleDeg?: number;
}

export type SourceKind = "device-motion" | "generic-sensor" | "gamepad" | "pointer-lock" | "pointer-drag" | "scripted" | "hid";

/**
 * An input source. Adapters do nothing at import time; `start` attaches listeners (and may ask
 * for permission, so call it from a user gesture), `stop` detaches them. A later WebHID
 * controller adapter implements the same interface with kind "hid".
 */
export interface SampleSource {
  readonly kind: SourceKind;
  start(sink: (fragment: SampleFragment) => void): Promise<void>;
  stop(): void;
}

export type { MotionSample };
