import type { SampleFragment, SampleSource } from "./types";

/**
 * Gamepad buttons as a bitmask, bit i = button i pressed (gamepadButtonMask).
 *
 * Purpose: the engine's `buttons` field; standard mapping buttons 0–16. Source: W3C Gamepad,
 * standard mapping. Cost: O(buttons).
 * @throws never.
 * @example gamepadButtonMask([{ pressed: true }, { pressed: false }, { pressed: true }]) // 5
 */
export function gamepadButtonMask(buttons: ReadonlyArray<{ pressed: boolean }>): number {
  let mask = 0;
  for (let i = 0; i < buttons.length && i < 32; i++) if (buttons[i]?.pressed) mask += 2 ** i;
  return mask;
}

/** The controller to read: the first connected one with the standard mapping, else the first connected one. */
export function pickGamepad(pads: ReadonlyArray<Gamepad | null>, index?: number): Gamepad | null {
  if (index !== undefined) return pads[index] ?? null;
  let any: Gamepad | null = null;
  for (const p of pads) {
    if (!p || p.connected === false) continue;
    if (p.mapping === "standard") return p;
    any ??= p;
  }
  return any;
}

/** Whether a controller is connected now (W3C Gamepad: getGamepads lists a pad only after a button press). */
export function gamepadConnected(win: Window): boolean {
  return typeof win.navigator.getGamepads === "function" && pickGamepad(Array.from(win.navigator.getGamepads())) !== null;
}

export interface GamepadSource extends SampleSource {
  /**
   * Read the controller now (once per animation frame) and hand one fragment to the sink, stamped
   * `nowMs`: the Gamepad API has no events, so a poll is the controller's clock. Its `inputMs` is
   * the pad's `timestamp` when that changed since the last poll.
   */
  poll(nowMs: number): void;
}

/**
 * Gamepad source (createGamepadSource).
 *
 * Purpose: sticks and buttons from `navigator.getGamepads()`, read once per animation frame:
 * by the caller's frame loop through `poll` (the task drives it, so a frame reads the pad before
 * it draws), or by the source's own requestAnimationFrame loop with `selfDriven` (the checks).
 * Every poll gives a fragment (a held stick keeps turning the view at its rate even when the pad
 * reports nothing new). `stick: "left" | "right"` picks axes 0/1 or 2/3 (y down positive). The
 * Gamepad API carries no motion data. Source: W3C Gamepad, standard mapping, `timestamp`.
 * Cost: one poll per frame.
 * @throws Error from `start` when the API is missing.
 * @example const pad = createGamepadSource(window, { stick: "right" }); await pad.start(sink); pad.poll(performance.now());
 */
export function createGamepadSource(win: Window, options: { index?: number; stick?: "left" | "right"; selfDriven?: boolean } = {}): GamepadSource {
  let frame = 0, running = false, lastStamp = -1;
  let sink: ((f: SampleFragment) => void) | null = null;
  const axisX = options.stick === "left" ? 0 : 2;
  const poll = (nowMs: number): void => {
    if (!running || !sink) return;
    const pad = pickGamepad(Array.from(win.navigator.getGamepads()), options.index);
    if (!pad) return;
    const fresh = pad.timestamp !== lastStamp;
    lastStamp = pad.timestamp;
    const f: SampleFragment = { tMs: nowMs, stick: { x: pad.axes[axisX] ?? 0, y: pad.axes[axisX + 1] ?? 0 }, buttons: gamepadButtonMask(pad.buttons) };
    if (fresh) f.inputMs = Math.min(pad.timestamp, nowMs);
    sink(f);
  };
  return {
    kind: "gamepad",
    poll,
    async start(s) {
      if (typeof win.navigator.getGamepads !== "function") throw new Error("gamepad: the Gamepad API is not available");
      sink = s;
      running = true;
      lastStamp = -1;
      if (options.selfDriven) {
        const loop = (): void => {
          if (!running) return;
          poll(win.performance.now());
          frame = win.requestAnimationFrame(loop);
        };
        frame = win.requestAnimationFrame(loop);
      }
    },
    stop() {
      running = false;
      sink = null;
      win.cancelAnimationFrame(frame);
    },
  };
}
