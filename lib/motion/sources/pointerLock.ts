import type { SampleSource } from "./types";

export interface PointerLockSource extends SampleSource {
  /** Whether the lock gives raw (unadjusted) movement: true, false (plain lock) or null (not locked yet). */
  readonly unadjusted: boolean | null;
  /** Whether the pointer is locked to the element now. */
  readonly locked: boolean;
  /**
   * Ask for the lock (call from a user gesture, such as a click on the element): raw movement
   * first, plain lock where raw is refused. Resolves true when locked.
   */
  lock(): Promise<boolean>;
}

/**
 * Pointer Lock source with raw mouse movement (createPointerLockSource).
 *
 * Purpose: a raw-mouse baseline. `lock()` asks `requestPointerLock({ unadjustedMovement: true })`,
 * which turns off the operating system's pointer acceleration (Chromium on some platforms);
 * where that is refused (NotSupportedError) it falls back to plain pointer lock and reports
 * `unadjusted: false`. Movement counts only while locked; where the lock is refused or missing,
 * the plain `movementX/Y` of moves over the element count instead. Deltas come from every coalesced
 * event, stamped with its `timeStamp`. `onLockChange` hears when the lock is lost (Escape) so
 * the page can ask for a click again. Source: W3C Pointer Lock 2.0 (`unadjustedMovement`);
 * W3C Pointer Events (`getCoalescedEvents`, `movementX/Y`). Cost: one fragment per event.
 * @throws never from `start`; `lock` resolves false when both requests are refused.
 * @example const src = createPointerLockSource(canvas); await src.start(sink); canvas.onclick = () => void src.lock();
 */
export function createPointerLockSource(element: HTMLElement, options: { onLockChange?: (locked: boolean) => void } = {}): PointerLockSource {
  let unadjusted: boolean | null = null, unlockedMoves = false;
  let listener: ((e: PointerEvent) => void) | null = null, change: (() => void) | null = null;
  const doc = element.ownerDocument;
  const isLocked = (): boolean => doc.pointerLockElement === element;
  return {
    kind: "pointer-lock",
    get unadjusted() {
      return unadjusted;
    },
    get locked() {
      return isLocked();
    },
    async lock() {
      if (isLocked()) return true;
      const request = element.requestPointerLock as unknown as ((options?: { unadjustedMovement?: boolean }) => Promise<void> | void) | undefined;
      if (typeof request !== "function") {
        unlockedMoves = true;
        return false;
      }
      try {
        await request.call(element, { unadjustedMovement: true });
        unadjusted = true;
      } catch {
        try {
          await request.call(element);
          unadjusted = false;
        } catch {
          unlockedMoves = true;
          return false;
        }
      }
      return isLocked();
    },
    async start(sink) {
      listener = (e: PointerEvent) => {
        // before the lock nothing moves; where the lock was refused, moves over the element count instead
        if (!isLocked() && !(unlockedMoves && e.target === element)) return;
        const events = typeof e.getCoalescedEvents === "function" ? e.getCoalescedEvents() : [];
        for (const c of events.length > 0 ? events : [e]) sink({ tMs: c.timeStamp, inputMs: c.timeStamp, pointer: { dx: c.movementX, dy: c.movementY } });
      };
      change = () => options.onLockChange?.(isLocked());
      doc.addEventListener("pointermove", listener);
      doc.addEventListener("pointerlockchange", change);
    },
    stop() {
      if (listener) doc.removeEventListener("pointermove", listener);
      if (change) doc.removeEventListener("pointerlockchange", change);
      listener = null;
      change = null;
      if (isLocked()) doc.exitPointerLock();
    },
  };
}
