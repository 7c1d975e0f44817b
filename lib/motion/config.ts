import { z } from "zod";

/** Input techniques, in the product's words. */
export const techniques = ["motion", "stick", "motion+stick", "motion+touch", "mouse", "touch", "tilt-rate"] as const;
export type Technique = (typeof techniques)[number];

/**
 * The engine's input channels: `motion` (device rotation), `tilt` (tilt-rate), `stick` (stick
 * rate and heading stick) and `pointer` (mouse and touch).
 */
export const inputChannels = ["motion", "tilt", "stick", "pointer"] as const;
export type InputChannel = (typeof inputChannels)[number];

/**
 * What the clutch covers: `all` channels, or only the `device` channels (motion and tilt), so
 * that with motion+stick or motion+touch the stick or the touch drag keeps working while the
 * hand re-centres the device.
 */
export const clutchCoverages = { all: inputChannels, device: ["motion", "tilt"] } as const satisfies Record<string, readonly InputChannel[]>;
export type ClutchCoverage = keyof typeof clutchCoverages;

const button = z.number().int().min(0).max(31).nullable();
const positive = z.number().finite().positive();
const nonNegative = z.number().finite().min(0);

/**
 * Transfer-function configuration, as the study designer stores it (one flat JSON object per
 * factor level). Every field has a default; units are in the names (DegPerS = deg/s, Ms = ms) or
 * documented in docs/configuration.md. Unknown fields are rejected, so a typo cannot pass silently.
 */
export const transferConfigSchema = z
  .strictObject({
    technique: z.enum(techniques).default("motion"),
    displayMode: z.enum(["view", "cursor"]).default("view"),
    pixelsPerDegree: positive.max(1000).default(10),

    frame: z.enum(["device", "gravity", "adaptive"]).default("device"),
    deviceHorizontalAxis: z.enum(["screen-normal", "screen-up", "both"]).default("screen-up"),
    gravityFilterTimeMs: nonNegative.max(10_000).default(500),
    accelerometerInverted: z.boolean().default(false),

    biasXDegPerS: z.number().finite().min(-50).max(50).default(0),
    biasYDegPerS: z.number().finite().min(-50).max(50).default(0),
    biasZDegPerS: z.number().finite().min(-50).max(50).default(0),

    gain: positive.max(50).default(1),
    horizontalGainMultiplier: positive.max(10).default(1),
    verticalGainMultiplier: positive.max(10).default(1),
    invertVertical: z.boolean().default(false),

    gainCurve: z.enum(["constant", "two-level", "power"]).default("constant"),
    curveSlowSpeedDegPerS: nonNegative.max(1000).default(5),
    curveFastSpeedDegPerS: positive.max(2000).default(30),
    curveSlowGainFactor: positive.max(1).default(0.5),
    curveExponent: z.number().finite().min(1).max(4).default(1.5),
    curveReferenceSpeedDegPerS: positive.max(2000).default(30),

    smoothingTimeMs: nonNegative.max(1000).default(0),
    smoothingSpeedDegPerS: positive.max(1000).default(10),
    deadBandDegPerS: nonNegative.max(100).default(0),
    addedLatencyMs: nonNegative.max(1000).default(0),
    maxSampleGapMs: positive.max(10_000).default(100),

    stickMode: z.enum(["rate", "heading"]).default("rate"),
    stickDeadZone: nonNegative.max(0.9).default(0.15),
    stickOuterEdge: positive.max(1).default(0.95),
    stickExponent: positive.max(5).default(2),
    stickMaxRateDegPerS: positive.max(2000).default(180),
    headingRimThreshold: positive.max(1).default(0.9),
    headingTurnTimeMs: nonNegative.max(2000).default(100),

    tiltDeadZoneDeg: nonNegative.max(45).default(5),
    tiltMaxDeg: positive.max(90).default(30),
    tiltExponent: positive.max(5).default(1),
    tiltMaxRateDegPerS: positive.max(2000).default(120),

    pointerDegreesPerPixel: positive.max(10).default(0.1),
    pointerCursorGain: positive.max(20).default(1),

    clutchButton: button.default(0),
    clutchMode: z.enum(["hold", "toggle"]).default("hold"),
    clutchCovers: z.enum(["all", "device"]).default("all"),
    activation: z.enum(["always", "while-aiming"]).default("always"),
    aimButton: button.default(1),
    recenterButton: button.default(2),
  })
  .superRefine((c, ctx) => {
    if (c.curveFastSpeedDegPerS <= c.curveSlowSpeedDegPerS) {
      ctx.addIssue({ code: "custom", path: ["curveFastSpeedDegPerS"], message: "must be greater than curveSlowSpeedDegPerS" });
    }
    if (c.stickOuterEdge <= c.stickDeadZone) {
      ctx.addIssue({ code: "custom", path: ["stickOuterEdge"], message: "must be greater than stickDeadZone" });
    }
    if (c.tiltMaxDeg <= c.tiltDeadZoneDeg) {
      ctx.addIssue({ code: "custom", path: ["tiltMaxDeg"], message: "must be greater than tiltDeadZoneDeg" });
    }
    if (c.activation === "while-aiming" && c.aimButton === null) {
      ctx.addIssue({ code: "custom", path: ["aimButton"], message: "must be set when activation is while-aiming" });
    }
    const used: Array<[string, number | null]> = [["clutchButton", c.clutchButton], ["aimButton", c.aimButton], ["recenterButton", c.recenterButton]];
    for (let i = 0; i < used.length; i++) {
      for (let j = 0; j < i; j++) {
        const a = used[j], b = used[i];
        if (a && b && a[1] !== null && a[1] === b[1]) {
          ctx.addIssue({ code: "custom", path: [b[0]], message: `must differ from ${a[0]} (both are button ${b[1]})` });
        }
      }
    }
  });

/** A validated configuration with every default filled in. */
export type TransferConfig = z.output<typeof transferConfigSchema>;
/** What a study designer may store: any subset of the fields. */
export type TransferConfigInput = z.input<typeof transferConfigSchema>;

/** The configuration with every field at its default. */
export const defaultTransferConfig: TransferConfig = transferConfigSchema.parse({});

/** A configuration that failed validation; `issues` lists "field: rule" for each problem. */
export class TransferConfigError extends Error {
  readonly issues: string[];
  constructor(issues: string[]) {
    super(`invalid transfer configuration: ${issues.join("; ")}`);
    this.name = "TransferConfigError";
    this.issues = issues;
  }
}

/**
 * Parse a stored transfer configuration (parseTransferConfig).
 *
 * Purpose: the one entry point from stored JSON to a {@link TransferConfig}; fills defaults.
 * Source: the project's own schema (docs/configuration.md). Cost: O(fields).
 * @throws TransferConfigError naming each field and rule, e.g. "gain: Too small: expected number to be >0".
 * @example parseTransferConfig({ gain: 6 }).gain // 6
 */
export function parseTransferConfig(input: unknown): TransferConfig {
  const renamed = renamedFieldIssues(input);
  if (renamed.length > 0) throw new TransferConfigError(renamed);
  const result = transferConfigSchema.safeParse(input);
  if (result.success) return result.data;
  const issues = result.error.issues.map((issue) => {
    if (issue.code === "unrecognized_keys") {
      return `${issue.keys.join(", ")}: not a configuration field`;
    }
    const field = issue.path.length > 0 ? issue.path.join(".") : "(configuration)";
    return `${field}: ${issue.message}`;
  });
  throw new TransferConfigError(issues);
}

/** Fields and values renamed since configurations were first stored: old name → new name. */
export const renamedConfigFields: Readonly<Record<string, string>> = {
  snapTurnThreshold: "headingRimThreshold",
  snapTurnDurationMs: "headingTurnTimeMs",
};

/**
 * Issues for names a configuration may still carry from before a rename (renamedFieldIssues):
 * `stickMode: "snap-turn"` (now `"heading"`) and the `snapTurn*` fields. Stored designs were
 * rewritten by a migration; files kept elsewhere (replay configurations, old archives) are
 * refused with the new name rather than read silently. Cost: O(fields).
 */
function renamedFieldIssues(input: unknown): string[] {
  if (input === null || typeof input !== "object" || Array.isArray(input)) return [];
  const o = input as Record<string, unknown>;
  const issues: string[] = [];
  if (o.stickMode === "snap-turn") issues.push('stickMode: "snap-turn" was renamed "heading" (the heading stick); use "heading"');
  for (const [old, now] of Object.entries(renamedConfigFields)) {
    if (old in o) issues.push(`${old}: was renamed ${now}; use ${now}`);
  }
  return issues;
}
