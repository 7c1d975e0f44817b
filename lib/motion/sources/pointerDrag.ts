import type { SampleFragment, SampleSource } from "./types";

export interface PointerDragOptions {
  /**
   * A touch that ends having moved at most this far (CSS px) is a tap, not a drag: its movement
   * is held back and `onTap` is called with the time it ended. Without `onTap` every touch drags.
   */
  tapSlopPx?: number;
  onTap?: (tMs: number) => void;
}

/** The three handlers of a pointer source (`up` also hears pointercancel). */
interface PointerHandlers {
  down: (e: PointerEvent) => void;
  move: (e: PointerEvent) => void;
  up: (e: PointerEvent) => void;
}

/** Attaches a pointer source's listeners to the element; returns what detaches them. */
function attachPointer(element: HTMLElement, h: PointerHandlers): () => void {
  element.addEventListener("pointerdown", h.down);
  element.addEventListener("pointermove", h.move);
  element.addEventListener("pointerup", h.up);
  element.addEventListener("pointercancel", h.up);
  return () => {
    element.removeEventListener("pointerdown", h.down);
    element.removeEventListener("pointermove", h.move);
    element.removeEventListener("pointerup", h.up);
    element.removeEventListener("pointercancel", h.up);
  };
}

/** Every coalesced event of a move (W3C Pointer Events `getCoalescedEvents`), or the event itself. */
function coalesced(e: PointerEvent): PointerEvent[] {
  const events = typeof e.getCoalescedEvents === "function" ? e.getCoalescedEvents() : [];
  return events.length > 0 ? events : [e];
}

/** Keeps the pointer's events on the element while it is down (`setPointerCapture`). */
function capture(element: HTMLElement, pointerId: number): void {
  try {
    element.setPointerCapture(pointerId);
  } catch {
    /* a synthetic or already-released pointer */
  }
}

/**
 * Pointer or touch drag source (createPointerDragSource).
 *
 * Purpose: the touch channel of motion+touch and the touch technique in view mode: while a
 * pointer is down on the element, its movement since the previous event, from every coalesced
 * event. With a tap slop, movement is held back until the touch has gone beyond it (so a tap
 * never moves the aim), then released at once and followed as it comes; a touch that never went
 * beyond it is a tap. Captures the pointer and sets `touch-action: none` so the browser does not
 * scroll. Source: W3C Pointer Events (`getCoalescedEvents`, `setPointerCapture`). Cost: one
 * fragment per coalesced event.
 * @throws never.
 * @example await createPointerDragSource(surface, { tapSlopPx: 10, onTap: (t) => select(t) }).start(sink);
 */
export function createPointerDragSource(element: HTMLElement, options: PointerDragOptions = {}): SampleSource {
  let detach: (() => void) | null = null;
  let active = -1, lastX = 0, lastY = 0, startX = 0, startY = 0, dragging = false;
  const slop = options.onTap ? (options.tapSlopPx ?? 10) : 0;
  return {
    kind: "pointer-drag",
    async start(sink) {
      element.style.touchAction = "none";
      const emit = (c: PointerEvent): void => {
        const f: SampleFragment = { tMs: c.timeStamp, inputMs: c.timeStamp, pointer: { dx: c.clientX - lastX, dy: c.clientY - lastY } };
        lastX = c.clientX;
        lastY = c.clientY;
        sink(f);
      };
      detach = attachPointer(element, {
        down: (e) => {
          if (active !== -1 || (e.pointerType === "mouse" && e.button !== 0)) return;
          active = e.pointerId;
          lastX = startX = e.clientX;
          lastY = startY = e.clientY;
          dragging = slop === 0;
          capture(element, e.pointerId);
        },
        move: (e) => {
          if (e.pointerId !== active) return;
          for (const c of coalesced(e)) {
            if (!dragging) {
              if (Math.hypot(c.clientX - startX, c.clientY - startY) <= slop) continue;
              dragging = true; // the held-back movement goes out with this event
            }
            emit(c);
          }
        },
        up: (e) => {
          if (e.pointerId !== active) return;
          active = -1;
          if (!dragging && e.type === "pointerup") options.onTap?.(e.timeStamp);
        },
      });
    },
    stop() {
      detach?.();
      detach = null;
      active = -1;
    },
  };
}

/**
 * Direct touch source (createTouchDirectSource).
 *
 * Purpose: the touch technique in cursor mode: the cursor goes where the finger is. Each
 * touch-down and movement gives the finger's position in the element's CSS px (x right, y down,
 * from every coalesced event); the engine puts the cursor there (the sample's pointerX/Y), and a
 * replay of the recorded positions does the same. `onDown` hears every touch-down after its
 * fragment (for selection on touch-down). Source: W3C Pointer Events (`getCoalescedEvents`,
 * `setPointerCapture`). Cost: one fragment per coalesced event.
 * @throws never.
 * @example await createTouchDirectSource(canvas, (t) => select(t)).start(sink);
 */
export function createTouchDirectSource(element: HTMLElement, onDown?: (tMs: number) => void): SampleSource {
  let detach: (() => void) | null = null;
  let active = -1, left = 0, top = 0;
  return {
    kind: "touch-direct",
    async start(sink) {
      element.style.touchAction = "none";
      const at = (c: PointerEvent): void => sink({ tMs: c.timeStamp, inputMs: c.timeStamp, position: { x: c.clientX - left, y: c.clientY - top } });
      detach = attachPointer(element, {
        down: (e) => {
          if (active !== -1 || (e.pointerType === "mouse" && e.button !== 0)) return;
          active = e.pointerId;
          const r = element.getBoundingClientRect();
          left = r.left;
          top = r.top;
          capture(element, e.pointerId);
          at(e);
          onDown?.(e.timeStamp);
        },
        move: (e) => {
          if (e.pointerId === active) for (const c of coalesced(e)) at(c);
        },
        up: (e) => {
          if (e.pointerId === active) active = -1;
        },
      });
    },
    stop() {
      detach?.();
      detach = null;
      active = -1;
    },
  };
}
