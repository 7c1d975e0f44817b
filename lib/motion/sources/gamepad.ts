import type { SampleSource } from "./types";

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

/**
 * Gamepad source (createGamepadSource).
 *
 * Purpose: sticks and buttons, polled with `navigator.getGamepads()` once per animation frame;
 * a fragment only when the pad's `timestamp` shows new data. `stick: "left" | "right"` picks
 * axes 0/1 or 2/3 (y down positive). The Gamepad API carries no motion data. Source: W3C
 * Gamepad, standard mapping and `timestamp`. Cost: one poll per frame.
 * @throws Error from `start` when the API is missing.
 * @example await createGamepadSource(window, { stick: "right" }).start(sink);
 */
export function createGamepadSource(win: Window, options: { index?: number; stick?: "left" | "right" } = {}): SampleSource {
  let frame = 0, running = false, lastStamp = -1;
  const axisX = options.stick === "left" ? 0 : 2;
  return {
    kind: "gamepad",
    async start(sink) {
      if (typeof win.navigator.getGamepads !== "function") throw new Error("gamepad: the Gamepad API is not available");
      running = true;
      const poll = (): void => {
        if (!running) return;
        const pads = win.navigator.getGamepads();
        const pad = options.index !== undefined ? pads[options.index] : pads.find((p) => p !== null);
        if (pad && pad.timestamp !== lastStamp) {
          lastStamp = pad.timestamp;
          sink({
            tMs: pad.timestamp,
            stick: { x: pad.axes[axisX] ?? 0, y: pad.axes[axisX + 1] ?? 0 },
            buttons: gamepadButtonMask(pad.buttons),
          });
        }
        frame = win.requestAnimationFrame(poll);
      };
      frame = win.requestAnimationFrame(poll);
    },
    stop() {
      running = false;
      win.cancelAnimationFrame(frame);
    },
  };
}
