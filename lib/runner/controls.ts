import type { Technique, TransferConfig } from "@/lib/motion/config";
import { inputPathsFor, usesMotion } from "./inputPaths";

/** The button bits (controller button numbers) the task's controls stand for. */
export interface ControlMasks {
  select: number;
  clutch: number;
  aim: number;
  recenter: number;
}

const maskOf = (b: number | null): number => (b === null ? 0 : 2 ** b);

/**
 * Button bits of the task's controls (controlMasks).
 *
 * Purpose: on-screen controls, keys and the mouse's right button act as the controller buttons
 * the condition names, so the engine (and a replay of the recorded stream) sees one bitmask
 * whatever the participant pressed. Source: W3C Gamepad standard mapping (button numbers).
 * Cost: O(1).
 * @throws never.
 * @example controlMasks({ clutchButton: 0, aimButton: 1, recenterButton: 2 }, 3) // { select: 8, clutch: 1, aim: 2, recenter: 4 }
 */
export function controlMasks(c: Pick<TransferConfig, "clutchButton" | "aimButton" | "recenterButton">, selectButton: number): ControlMasks {
  return { select: maskOf(selectButton), clutch: maskOf(c.clutchButton), aim: maskOf(c.aimButton), recenter: maskOf(c.recenterButton) };
}

/** Buttons 0–16 of the W3C Gamepad standard mapping, by their place on the controller (vendors' letters common practice). */
const STANDARD_BUTTONS = [
  "the bottom face button (A, or cross)", "the right face button (B, or circle)", "the left face button (X, or square)", "the top face button (Y, or triangle)",
  "the left shoulder button", "the right shoulder button", "the left trigger", "the right trigger",
  "the back (select) button", "the start button", "the left stick (pressed in)", "the right stick (pressed in)",
  "the D-pad up", "the D-pad down", "the D-pad left", "the D-pad right", "the centre (home) button",
];

/**
 * A controller button in words (controllerButtonName).
 *
 * Purpose: instructions name a button by where it is, not by its number. Source: W3C Gamepad
 * "Standard Gamepad" button layout (indices 0–16). Cost: O(1).
 * @throws never.
 * @example controllerButtonName(7) // "the right trigger"
 */
export function controllerButtonName(index: number): string {
  return STANDARD_BUTTONS[index] ?? `button ${index}`;
}

/** The keys the runner listens to (our choice; shown to the participant). */
export const CONTROL_KEYS = { select: "Space", clutch: "Shift", aim: "A", recenter: "R" } as const;

/** Which controls a condition shows. */
export interface ControlSet {
  /** An on-screen or key control to select (selection "button", and "click" by key). */
  select: boolean;
  /** Hold to pause the input (clutch): techniques with a motion or stick channel. */
  clutch: boolean;
  /** Hold to aim: activation "while-aiming", which gates the device channels (motion, tilt-rate) only. */
  aim: boolean;
  /** Recenter: techniques with an orientation reference (motion channels, the heading stick). */
  recenter: boolean;
}

/**
 * The controls a condition offers (controlSet).
 *
 * Purpose: show only what does something: pausing (the clutch) where a device channel moves the
 * aim (a mouse or a finger is lifted instead), recentring where there is a reference to reset,
 * an aim control only when motion acts while it is held (activation gates the device channels,
 * not the stick or a pointer: lib/motion/stages/controls.ts). Source: science.md §8 (clutch,
 * activation, recenter). Cost: O(1).
 * @throws never.
 * @example controlSet("mouse", { clutchButton: 0, aimButton: 1, recenterButton: 2, activation: "always", stickMode: "rate" }, "click").clutch // false
 */
export function controlSet(technique: Technique, c: Pick<TransferConfig, "clutchButton" | "aimButton" | "recenterButton" | "activation" | "stickMode">, selection: "button" | "tap" | "click" | "dwell"): ControlSet {
  const device = usesMotion(technique) || technique === "stick";
  const heading = technique === "stick" && c.stickMode !== "rate";
  return {
    select: selection === "button",
    clutch: device && c.clutchButton !== null,
    aim: usesMotion(technique) && c.activation === "while-aiming" && c.aimButton !== null,
    recenter: (usesMotion(technique) || heading) && c.recenterButton !== null,
  };
}

/** What the participant has, for the wording. */
export interface ControlContext {
  touchScreen: boolean;
  keyboard: boolean;
  controller: boolean;
}

/** Per-technique instructions: how to aim, select, pause, aim-hold and recenter (null: no such control). */
export interface ControlHelp {
  aim: string;
  select: string;
  pause: string | null;
  aimHold: string | null;
  recenter: string | null;
}

const or = (parts: (string | false | undefined)[]): string => {
  const p = parts.filter((x): x is string => Boolean(x));
  return p.length <= 1 ? (p[0] ?? "") : `${p.slice(0, -1).join(", ")} or ${p.at(-1)}`;
};

/**
 * The instructions for one condition's controls (controlHelp), in our own words.
 *
 * Purpose: tell the participant, per technique, which control selects, pauses, aims and
 * recentres, naming only the controls this device has (an on-screen button on a touch screen, a
 * key on a keyboard, a controller button when a controller is there or required).
 * Source: the runner's controls ({@link controlSet}, {@link CONTROL_KEYS}). Cost: O(1).
 * @throws never.
 * @example controlHelp("touch", config, "tap", 3, 600, "cursor", { touchScreen: true, keyboard: false, controller: false }).select // "touch the highlighted target"
 */
export function controlHelp(
  technique: Technique, c: TransferConfig, selection: "button" | "tap" | "click" | "dwell", selectButton: number, dwellMs: number,
  displayMode: "cursor" | "view", ctx: ControlContext,
): ControlHelp {
  const set = controlSet(technique, c, selection);
  const paths = inputPathsFor(technique, displayMode);
  const what = displayMode === "view" ? "the view" : "the cross";
  const pad = ctx.controller || paths.gamepad === "required";
  const aim = {
    motion: `Turn your device to move ${what}.`,
    "tilt-rate": `Tilt your device to move ${what}: the further you tilt, the faster it moves; hold the device as it was at the start to stop.`,
    stick: c.stickMode === "rate"
      ? `Push the right thumbstick of your controller to move ${what}: the further you push, the faster it moves.`
      : "Push the right thumbstick to its edge in a direction to turn the view that way; move it round the edge to keep turning.",
    "motion+stick": `Turn your device for fine aim and push the right thumbstick for large turns of ${what}.`,
    "motion+touch": `Turn your device for fine aim and drag a finger on the task area for large turns of ${what}.`,
    mouse: `Click the task area once so it takes the mouse pointer, then move the mouse to move ${what}. Esc gives the pointer back.`,
    touch: displayMode === "cursor" ? "Touch the screen where you want the cross to be." : "Drag a finger on the task area to turn the view.",
  }[technique];
  let select: string;
  if (selection === "dwell") select = `keep ${what === "the view" ? "the centre cross" : "the cross"} on the highlighted target for ${(dwellMs / 1000).toFixed(1)} s`;
  else if (selection === "button") select = or([ctx.touchScreen && "tap the Select button", ctx.keyboard && `press ${CONTROL_KEYS.select}`, pad && `press ${controllerButtonName(selectButton)}`]);
  else if (technique === "mouse") select = "click";
  else if (paths.pointer === "direct") select = "touch the highlighted target";
  else if (paths.pointer === "drag") select = "tap the task area without moving your finger";
  else if (selection === "tap") select = or([ctx.touchScreen && "tap anywhere on the task area", !ctx.touchScreen && "click the task area", ctx.keyboard && `press ${CONTROL_KEYS.select}`]);
  else select = or(["click the task area", ctx.keyboard && `press ${CONTROL_KEYS.select}`]);
  const hold = (onScreen: string, key: string, button: number | null, mouse?: string): string =>
    or([ctx.touchScreen && `hold the ${onScreen} button`, ctx.keyboard && `hold ${key}`, mouse && ctx.keyboard && mouse, pad && button !== null && `hold ${controllerButtonName(button)}`]);
  return {
    aim,
    select: select || "use the Select button",
    pause: set.clutch ? `To move your hand back without moving the aim, ${hold("Pause", CONTROL_KEYS.clutch, c.clutchButton)}.` : null,
    aimHold: set.aim
      ? `${technique === "motion" || technique === "tilt-rate" ? "The aim moves" : "Turning the device moves the aim"} only while you ${hold("Aim", CONTROL_KEYS.aim, c.aimButton, "hold the right mouse button")}${technique === "motion+stick" ? "; the thumbstick works at any time" : technique === "motion+touch" ? "; the touch drag works at any time" : ""}.`
      : null,
    recenter: set.recenter
      ? `${or([ctx.touchScreen && "The Recenter button", ctx.keyboard && `the ${CONTROL_KEYS.recenter} key`, pad && c.recenterButton !== null && controllerButtonName(c.recenterButton)])} makes the way you hold the device now the new starting point; the aim stays where it is.`.replace(/^./, (m) => m.toUpperCase())
      : null,
  };
}
