import { parseTransferConfig, type TransferConfig, type TransferConfigInput } from "./config";

/**
 * Named starting points for common setups, in plain words of our own. Each is a partial
 * configuration; {@link presetConfig} fills the defaults and validates it. Gains follow common
 * practice (beginners often use 2–3 view degrees per device degree, advanced players 6–7).
 */
export const presets = {
  /** Phone held upright like a window; device axes, screen-up axis for turning. */
  "phone-upright": { technique: "motion", frame: "device", deviceHorizontalAxis: "screen-up", gain: 2.5 },
  /** Phone or tablet held flat like a tray; device axes, screen-normal axis for turning. */
  "phone-flat": { technique: "motion", frame: "device", deviceHorizontalAxis: "screen-normal", gain: 2.5 },
  /** A separate controller held any way; the adaptive frame picks the turning axis. */
  "controller-any-hold": { technique: "motion", frame: "adaptive", gain: 3 },
  /** Turning about the true vertical, whatever the hold. */
  "true-vertical": { technique: "motion", frame: "gravity", gain: 3 },
  /** High gain with a slow-speed reduction for fine aim. */
  "fast-with-fine-aim": {
    technique: "motion", frame: "adaptive", gain: 6, gainCurve: "two-level",
    curveSlowSpeedDegPerS: 5, curveFastSpeedDegPerS: 40, curveSlowGainFactor: 0.4,
    smoothingTimeMs: 40, smoothingSpeedDegPerS: 8,
  },
  /** Stick for coarse turns, motion for fine aim. */
  "stick-coarse-motion-fine": { technique: "motion+stick", frame: "adaptive", gain: 1.5, stickMaxRateDegPerS: 240 },
  /** Touch drag for coarse turns, motion for fine aim. */
  "touch-coarse-motion-fine": { technique: "motion+touch", frame: "device", gain: 1.5, pointerDegreesPerPixel: 0.25 },
  /** Stick direction sets the heading; motion gives the vertical. */
  "heading-stick": { technique: "motion+stick", stickMode: "heading", frame: "adaptive", gain: 2 },
  /** Motion only while the aim button is held (e.g. a trigger). */
  "aim-button-motion": { technique: "motion", frame: "adaptive", gain: 3, activation: "while-aiming" },
  /** Thumbstick rate control alone. */
  "stick-only": { technique: "stick" },
  /** Tilt drives a rate, like a stick: a known poor mapping, kept for comparison. */
  "tilt-rate-comparison": { technique: "tilt-rate" },
  /** Raw-mouse baseline in cursor mode. */
  "mouse-baseline": { technique: "mouse", displayMode: "cursor", pointerCursorGain: 1 },
} as const satisfies Record<string, TransferConfigInput>;

export type PresetName = keyof typeof presets;
export const presetNames = Object.keys(presets) as PresetName[];

/**
 * Full configuration for a preset, with optional overrides (presetConfig).
 *
 * Purpose: study designers start from a named setup and change a few fields.
 * Source: the project's presets above. Cost: O(fields).
 * @throws TransferConfigError when the overrides break a rule; Error for an unknown name.
 * @example presetConfig("phone-flat").deviceHorizontalAxis // "screen-normal"
 */
export function presetConfig(name: PresetName, overrides: TransferConfigInput = {}): TransferConfig {
  const base = presets[name];
  if (base === undefined) throw new Error(`presetConfig: unknown preset "${String(name)}"`);
  return parseTransferConfig({ ...base, ...overrides });
}
