import type { MotionSample } from "../sample";

/**
 * A part of a sample, as one source knows it: a motion source has the gyroscope, a gamepad the
 * stick and buttons, a pointer source the deltas, the on-screen and keyboard controls their held
 * buttons. {@link createSampleMixer} joins them.
 */
export interface SampleFragment {
  /** When the sample is taken (ms, the page's performance clock); never earlier than the previous. */
  tMs: number;
  gyro?: { x: number; y: number; z: number };
  accel?: { x: number; y: number; z: number };
  stick?: { x: number; y: number };
  /** Controller buttons held (bitmask, bit i = button i). */
  buttons?: number;
  /** On-screen and keyboard controls held, as the controller buttons they stand for (bitmask). */
  controls?: number;
  /** Buttons pressed for one sample only (a recenter tap), as a bitmask. */
  pulse?: number;
  pointer?: { dx: number; dy: number };
  /** Where a touching finger is (CSS px in the task area's coordinates), for absolute touch. */
  position?: { x: number; y: number };
  screenAngleDeg?: number;
  /**
   * Time stamp of the input event this fragment carries new data from (ms, same clock), for the
   * input age at drawing; absent when the data is not new (a controller polled again unchanged).
   */
  inputMs?: number;
}

export type SourceKind = "device-motion" | "generic-sensor" | "gamepad" | "pointer-lock" | "pointer-drag" | "touch-direct" | "scripted" | "hid";

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
