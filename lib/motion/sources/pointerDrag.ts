import type { SampleSource } from "./types";

/**
 * Pointer or touch drag source (createPointerDragSource).
 *
 * Purpose: the touch channel of motion+touch (and the touch baseline): while a pointer is down
 * on the element, its movement since the previous event, from every coalesced event. Sets
 * `touch-action: none` so the browser does not scroll. Source: W3C Pointer Events
 * (`getCoalescedEvents`, `setPointerCapture`). Cost: one fragment per coalesced event.
 * @throws never.
 * @example await createPointerDragSource(surface).start(sink);
 */
export function createPointerDragSource(element: HTMLElement): SampleSource {
  let down: ((e: PointerEvent) => void) | null = null, move: ((e: PointerEvent) => void) | null = null, up: ((e: PointerEvent) => void) | null = null;
  let active = -1, lastX = 0, lastY = 0;
  return {
    kind: "pointer-drag",
    async start(sink) {
      element.style.touchAction = "none";
      down = (e) => {
        if (active !== -1) return;
        active = e.pointerId;
        lastX = e.clientX;
        lastY = e.clientY;
        element.setPointerCapture(e.pointerId);
      };
      move = (e) => {
        if (e.pointerId !== active) return;
        const events = typeof e.getCoalescedEvents === "function" ? e.getCoalescedEvents() : [];
        for (const c of events.length > 0 ? events : [e]) {
          sink({ tMs: c.timeStamp, pointer: { dx: c.clientX - lastX, dy: c.clientY - lastY } });
          lastX = c.clientX;
          lastY = c.clientY;
        }
      };
      up = (e) => {
        if (e.pointerId === active) active = -1;
      };
      element.addEventListener("pointerdown", down);
      element.addEventListener("pointermove", move);
      element.addEventListener("pointerup", up);
      element.addEventListener("pointercancel", up);
    },
    stop() {
      if (down) element.removeEventListener("pointerdown", down);
      if (move) element.removeEventListener("pointermove", move);
      if (up) {
        element.removeEventListener("pointerup", up);
        element.removeEventListener("pointercancel", up);
      }
      active = -1;
    },
  };
}
