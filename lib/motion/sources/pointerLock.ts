import type { SampleSource } from "./types";

/**
 * Pointer Lock source with raw mouse movement (createPointerLockSource).
 *
 * Purpose: a raw-mouse baseline: `requestPointerLock({ unadjustedMovement: true })` turns off
 * the operating system's pointer acceleration (Chromium); where refused it falls back to plain
 * pointer lock and reports `unadjusted: false`. Deltas come from `movementX/Y`, with every
 * coalesced event. Call `start` from a user gesture. Source: W3C Pointer Lock 2.0; W3C Pointer
 * Events (`getCoalescedEvents`). Cost: one fragment per event.
 * @throws Error from `start` when pointer lock is refused.
 * @example const src = createPointerLockSource(canvas); await src.start(sink); src.unadjusted // true in Chromium
 */
export function createPointerLockSource(element: HTMLElement): SampleSource & { readonly unadjusted: boolean } {
  let unadjusted = false;
  let listener: ((e: PointerEvent) => void) | null = null;
  const doc = element.ownerDocument;
  return {
    kind: "pointer-lock",
    get unadjusted() {
      return unadjusted;
    },
    async start(sink) {
      const request = element.requestPointerLock as unknown as (options?: { unadjustedMovement?: boolean }) => Promise<void> | void;
      try {
        await request.call(element, { unadjustedMovement: true });
        unadjusted = true;
      } catch {
        await request.call(element);
        unadjusted = false;
      }
      listener = (e: PointerEvent) => {
        const events = typeof e.getCoalescedEvents === "function" ? e.getCoalescedEvents() : [];
        for (const c of events.length > 0 ? events : [e]) sink({ tMs: c.timeStamp, pointer: { dx: c.movementX, dy: c.movementY } });
      };
      doc.addEventListener("pointermove", listener);
    },
    stop() {
      if (listener) doc.removeEventListener("pointermove", listener);
      listener = null;
      if (doc.pointerLockElement === element) doc.exitPointerLock();
    },
  };
}
