import type { TransferConfig } from "../config";

/** Which bits of the sample's `buttons` are the controls, and how they behave. */
export interface ControlsParams {
  /** Bit masks (1 << button, as a 32-bit integer), 0 when the control has no button. */
  clutchMask: number;
  aimMask: number;
  recenterMask: number;
  clutchToggle: boolean;
  whileAiming: boolean;
}

/** The controls as of the latest sample, and what the next sample needs to know. */
export interface ControlsState {
  prevButtons: number;
  latched: boolean;
  /** The clutch is engaged (held, or toggled on). */
  clutched: boolean;
  /** Activation allows device input (always, or the aim button is held). */
  aiming: boolean;
  /** The recenter button went down on this sample. */
  recenterPressed: boolean;
}

const maskOf = (button: number | null): number => (button === null ? 0 : 1 << button);

/** The controls' parameters from a configuration (controlsParams). Cost: O(1). */
export function controlsParams(c: Pick<TransferConfig, "clutchButton" | "aimButton" | "recenterButton" | "clutchMode" | "activation">): ControlsParams {
  return {
    clutchMask: maskOf(c.clutchButton),
    aimMask: maskOf(c.aimButton),
    recenterMask: maskOf(c.recenterButton),
    clutchToggle: c.clutchMode === "toggle",
    whileAiming: c.activation === "while-aiming",
  };
}

export const createControlsState = (): ControlsState => ({ prevButtons: 0, latched: false, clutched: false, aiming: true, recenterPressed: false });

/**
 * The controls stage (controlsStep): clutch, activation and recenter from the buttons bitmask.
 *
 * Purpose: `hold` clutch is engaged while its button is down, `toggle` flips on each press;
 * activation `while-aiming` allows device input only while the aim button is down; recenter
 * fires on the press (rising edge), once. Bit i is Gamepad button i (W3C Gamepad standard
 * mapping); bit 31 works too (32-bit masks). Source: science.md §8 "Clutch". Cost: O(1).
 * @throws never.
 * @example const s = createControlsState(); controlsStep(s, controlsParams(defaultTransferConfig), { buttons: 1 }); s.clutched // true
 */
export function controlsStep(state: ControlsState, p: ControlsParams, sample: { buttons?: number | undefined }): void {
  const buttons = sample.buttons ?? 0;
  const prev = state.prevButtons;
  const clutchDown = (buttons & p.clutchMask) !== 0;
  if (p.clutchToggle && clutchDown && (prev & p.clutchMask) === 0) state.latched = !state.latched;
  state.clutched = p.clutchToggle ? state.latched : clutchDown;
  state.aiming = !p.whileAiming || (buttons & p.aimMask) !== 0;
  state.recenterPressed = (buttons & p.recenterMask) !== 0 && (prev & p.recenterMask) === 0;
  state.prevButtons = buttons;
}
