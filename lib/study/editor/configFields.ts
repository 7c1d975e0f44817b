import type { TransferConfig, Technique } from "@/lib/motion/config";

/** The groups a researcher decides in, in the order the editor shows them. */
export const configGroups = [
  { id: "technique", title: "Technique and display" },
  { id: "gain", title: "Gain and its curve" },
  { id: "filtering", title: "Smoothing, dead band, latency" },
  { id: "frame", title: "Reference frame" },
  { id: "stick", title: "Stick and tilt" },
  { id: "controls", title: "Controls" },
] as const;
export type ConfigGroupId = (typeof configGroups)[number]["id"];

/** What the editor says about one configuration field; range, default and choices come from the schema. */
export interface ConfigFieldEntry {
  group: ConfigGroupId;
  label: string;
  /** Unit as printed beside the value ("°/s", "ms", "view ° per device °"); empty for none. */
  unit: string;
  /** One sentence: what the field does, in the product's words. */
  help: string;
  /** Whether the field changes anything for a configuration (the editor hides it otherwise). */
  relevant: (c: TransferConfig) => boolean;
  /** Shown only when the researcher asks for every setting (rarely changed). */
  advanced?: boolean;
  /** Set elsewhere (read-only here), with the sentence saying where. */
  setElsewhere?: string;
  /** Plain labels for an enum's values. */
  choices?: Record<string, string>;
}

const has = (t: Technique, ...list: Technique[]): boolean => list.includes(t);
/** Channels per technique, as the engine runs them (lib/motion/engineCore.ts). */
export const motionChannel = (c: TransferConfig): boolean => has(c.technique, "motion", "motion+stick", "motion+touch");
export const stickChannel = (c: TransferConfig): boolean => has(c.technique, "stick", "motion+stick");
export const pointerChannel = (c: TransferConfig): boolean => has(c.technique, "motion+touch", "mouse", "touch");
export const tiltChannel = (c: TransferConfig): boolean => c.technique === "tilt-rate";
const always = (): boolean => true;
const twoLevel = (c: TransferConfig): boolean => motionChannel(c) && c.gainCurve === "two-level";
const power = (c: TransferConfig): boolean => motionChannel(c) && c.gainCurve === "power";
const rateStick = (c: TransferConfig): boolean => stickChannel(c) && c.stickMode === "rate";
const headingStick = (c: TransferConfig): boolean => stickChannel(c) && c.stickMode !== "rate";
const bias = (axis: string): ConfigFieldEntry => ({
  group: "frame", label: `Gyroscope bias, ${axis} axis`, unit: "°/s", advanced: true,
  help: "Replaced in every session by the participant's rest calibration; set it only for replays of streams recorded without one.",
  relevant: (c) => motionChannel(c) || tiltChannel(c),
});

/**
 * Every field of the transfer configuration (lib/motion/config.ts) with its label, unit, group,
 * help and relevance. Keyed by the schema's own keys: the mapped type makes TypeScript refuse a
 * missing entry, and the editor's coverage test compares the keys with the schema at run time.
 */
export const configFieldCatalogue: { [K in keyof TransferConfig]: ConfigFieldEntry } = {
  technique: {
    group: "technique", label: "Input technique", unit: "", relevant: always,
    help: "What moves the view or cursor: device rotation, a thumbstick, both, a touch drag, a mouse, or tilt driving a rate.",
    choices: { motion: "motion (device rotation)", stick: "stick (thumbstick rate)", "motion+stick": "motion + stick", "motion+touch": "motion + touch drag", mouse: "mouse", touch: "touch", "tilt-rate": "tilt-rate (tilt drives a rate)" },
  },
  displayMode: {
    group: "technique", label: "Display mode", unit: "", relevant: always,
    setElsewhere: "Follows the task's display mode (set under Task).",
    help: "Cursor: a 2-D cursor on the page. View: first-person view rotation with a fixed crosshair.",
  },
  pixelsPerDegree: {
    group: "technique", label: "Cursor pixels per degree", unit: "px per view °",
    help: "In cursor mode, how many CSS pixels one degree of (gain-scaled) rotation moves the cursor.",
    relevant: (c) => c.displayMode === "cursor" && (motionChannel(c) || stickChannel(c) || tiltChannel(c)),
  },
  frame: {
    group: "frame", label: "Reference frame", unit: "", relevant: motionChannel,
    help: "Which rotation counts as turning: axes fixed to the device, rotation about the true vertical (gravity), or a blend weighted by where gravity points (adaptive).",
    choices: { device: "device axes", gravity: "true vertical (gravity)", adaptive: "adaptive (any hold)" },
  },
  deviceHorizontalAxis: {
    group: "frame", label: "Turning axis (device frame)", unit: "",
    help: "Screen-up suits a device held upright like a window; screen-normal suits one held flat like a tray; both adds them.",
    relevant: (c) => motionChannel(c) && c.frame === "device",
    choices: { "screen-up": "screen-up axis (held upright)", "screen-normal": "screen-normal axis (held flat)", both: "both axes" },
  },
  gravityFilterTimeMs: {
    group: "frame", label: "Gravity filter time", unit: "ms", advanced: true,
    help: "Time constant of the low-pass that finds 'up' from the accelerometer; longer is steadier but follows a change of hold more slowly.",
    relevant: (c) => (motionChannel(c) && c.frame !== "device") || tiltChannel(c),
  },
  accelerometerInverted: {
    group: "frame", label: "Accelerometer read inverted", unit: "", advanced: true,
    setElsewhere: "Set in every session by the device check's gravity-sign test.",
    help: "For devices whose accelerometer reports 'up' as 'down': readings are negated before use. Only replays of streams recorded without the check need it set here.",
    relevant: (c) => (motionChannel(c) && c.frame !== "device") || tiltChannel(c),
  },
  biasXDegPerS: bias("x"),
  biasYDegPerS: bias("y"),
  biasZDegPerS: bias("z"),
  gain: {
    group: "gain", label: "CD gain", unit: "view ° per device °", relevant: motionChannel,
    help: "View degrees per device degree (cursor mode: times pixels per degree). At gain 6 a 30° device turn gives a 180° view turn.",
  },
  horizontalGainMultiplier: {
    group: "gain", label: "Horizontal gain multiplier", unit: "×", relevant: motionChannel, advanced: true,
    help: "Multiplies the gain for left–right turns only.",
  },
  verticalGainMultiplier: {
    group: "gain", label: "Vertical gain multiplier", unit: "×", relevant: motionChannel, advanced: true,
    help: "Multiplies the gain for up–down tilts only (a lower vertical gain is common practice).",
  },
  invertVertical: {
    group: "gain", label: "Invert vertical", unit: "", relevant: motionChannel,
    help: "Tilting the top edge away moves the view down instead of up.",
  },
  gainCurve: {
    group: "gain", label: "Gain curve", unit: "", relevant: motionChannel,
    help: "Constant: one gain at every speed. Two-level: a lower gain below a slow speed, the full gain above a fast speed, blended between. Power: output speed grows as a power of device speed.",
    choices: { constant: "constant", "two-level": "two-level (slow / fast)", power: "power" },
  },
  curveSlowSpeedDegPerS: {
    group: "gain", label: "Slow speed", unit: "°/s", relevant: twoLevel,
    help: "Below this device speed the gain is the slow factor times the gain.",
  },
  curveFastSpeedDegPerS: {
    group: "gain", label: "Fast speed", unit: "°/s", relevant: twoLevel,
    help: "Above this device speed the full gain applies; it must be greater than the slow speed.",
  },
  curveSlowGainFactor: {
    group: "gain", label: "Slow gain factor", unit: "× gain", relevant: twoLevel,
    help: "The share of the gain used for slow rotation (fine aim).",
  },
  curveExponent: {
    group: "gain", label: "Curve exponent", unit: "", relevant: power,
    help: "Output speed ∝ device speed to this power; 1 is a constant gain.",
  },
  curveReferenceSpeedDegPerS: {
    group: "gain", label: "Reference speed", unit: "°/s", relevant: power,
    help: "The device speed at which the power curve gives exactly the nominal gain.",
  },
  smoothingTimeMs: {
    group: "filtering", label: "Fine-aim smoothing time", unit: "ms", relevant: motionChannel,
    help: "Time constant of the smoothing applied to slow input only; 0 turns it off. Heavy smoothing feels sluggish.",
  },
  smoothingSpeedDegPerS: {
    group: "filtering", label: "Fine-aim smoothing up to", unit: "°/s",
    help: "Input slower than this is smoothed (fully at rest, less towards this speed); faster input passes unchanged.",
    relevant: (c) => motionChannel(c) && c.smoothingTimeMs > 0,
  },
  deadBandDegPerS: {
    group: "filtering", label: "Dead band", unit: "°/s", relevant: motionChannel,
    help: "Rotation slower than this is ignored and subtracted from faster rotation. Studies add it to measure the harm; keep 0 otherwise.",
  },
  addedLatencyMs: {
    group: "filtering", label: "Added latency", unit: "ms", relevant: always,
    help: "Delay added to the output, on top of the device's own; studies add it to measure the harm.",
  },
  maxSampleGapMs: {
    group: "filtering", label: "Longest sample gap used", unit: "ms", relevant: always, advanced: true,
    help: "A longer pause between sensor samples counts as this long, so a stall does not turn into a jump.",
  },
  stickMode: {
    group: "stick", label: "Stick mode", unit: "", relevant: stickChannel,
    help: "Rate: the stick's deflection sets a turning speed. Heading: pushing the stick to the rim turns the view to the stick's direction; motion gives the vertical.",
    choices: { rate: "rate (deflection sets speed)", heading: "heading (direction sets heading)" },
  },
  stickDeadZone: {
    group: "stick", label: "Stick dead zone", unit: "of full deflection", relevant: rateStick,
    help: "Deflection inside this radius gives no movement.",
  },
  stickOuterEdge: {
    group: "stick", label: "Stick outer edge", unit: "of full deflection", relevant: rateStick,
    help: "From this radius on the stick gives the full rate; it must be greater than the dead zone.",
  },
  stickExponent: {
    group: "stick", label: "Stick curve exponent", unit: "", relevant: rateStick,
    help: "Response from dead zone to outer edge: 1 is linear, 2 gives finer control near the centre.",
  },
  stickMaxRateDegPerS: {
    group: "stick", label: "Stick top rate", unit: "°/s", relevant: rateStick,
    help: "Turning speed at full deflection.",
  },
  headingRimThreshold: {
    group: "stick", label: "Heading stick threshold", unit: "of full deflection", relevant: headingStick,
    help: "How far the stick must be pushed before its direction sets the heading.",
  },
  headingTurnTimeMs: {
    group: "stick", label: "Heading turn duration", unit: "ms", relevant: headingStick,
    help: "The turn to a new heading is spread over this time (0: at once).",
  },
  tiltDeadZoneDeg: {
    group: "stick", label: "Tilt dead zone", unit: "°", relevant: tiltChannel,
    help: "Tilt from the starting hold smaller than this gives no movement.",
  },
  tiltMaxDeg: {
    group: "stick", label: "Tilt for full rate", unit: "°", relevant: tiltChannel,
    help: "Tilt at which the top rate is reached; it must be greater than the tilt dead zone.",
  },
  tiltExponent: {
    group: "stick", label: "Tilt curve exponent", unit: "", relevant: tiltChannel,
    help: "Response from dead zone to full tilt: 1 is linear.",
  },
  tiltMaxRateDegPerS: {
    group: "stick", label: "Tilt top rate", unit: "°/s", relevant: tiltChannel,
    help: "Turning speed at full tilt.",
  },
  pointerDegreesPerPixel: {
    group: "gain", label: "Drag / mouse gain (view mode)", unit: "view ° per px",
    help: "View degrees per CSS pixel of mouse movement or touch drag.",
    relevant: (c) => pointerChannel(c) && c.displayMode === "view",
  },
  pointerCursorGain: {
    group: "gain", label: "Drag / mouse gain (cursor mode)", unit: "cursor px per px",
    help: "Cursor pixels per CSS pixel of mouse movement or touch drag.",
    relevant: (c) => pointerChannel(c) && c.displayMode === "cursor",
  },
  clutchButton: {
    group: "controls", label: "Clutch button", unit: "", relevant: motionChannel,
    help: "Controller button (W3C standard mapping index) that suspends motion while held, so the hand can re-centre.",
  },
  clutchMode: {
    group: "controls", label: "Clutch behaviour", unit: "", relevant: (c) => motionChannel(c) && c.clutchButton !== null,
    help: "Hold: suspended while held. Toggle: each press switches.",
    choices: { hold: "hold", toggle: "toggle" },
  },
  clutchCovers: {
    group: "controls", label: "Clutch suspends", unit: "", advanced: true,
    relevant: (c) => c.clutchButton !== null && (motionChannel(c) || tiltChannel(c)) && (stickChannel(c) || pointerChannel(c)),
    help: "Every input, or only device rotation and tilt (the stick or touch drag keeps working while the hand re-centres).",
    choices: { all: "every input", device: "device rotation and tilt only" },
  },
  activation: {
    group: "controls", label: "Motion active", unit: "", relevant: motionChannel,
    help: "Always, or only while an aim button is held (as with a trigger).",
    choices: { always: "always", "while-aiming": "only while aiming (aim button held)" },
  },
  aimButton: {
    group: "controls", label: "Aim button", unit: "", relevant: (c) => motionChannel(c) && c.activation === "while-aiming",
    help: "Controller button that enables motion while held.",
  },
  recenterButton: {
    group: "controls", label: "Recenter button", unit: "", relevant: (c) => motionChannel(c) || tiltChannel(c) || stickChannel(c),
    help: "Controller button that resets the orientation reference.",
  },
};

/** The catalogue's keys, in the schema's order. */
export const configFieldKeys = Object.keys(configFieldCatalogue) as (keyof TransferConfig)[];
