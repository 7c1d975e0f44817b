"use client";
import { useEffect } from "react";

type LockableOrientation = ScreenOrientation & { lock?: (o: string) => Promise<void> };

/** Whether this is a hand-held touch device (a coarse primary pointer), where the task goes fullscreen. */
export function handHeld(): boolean {
  return window.matchMedia("(pointer: coarse)").matches && navigator.maxTouchPoints > 0;
}

/**
 * Fullscreen and the present orientation locked, where the browser supports them (Fullscreen
 * API; Screen Orientation `lock`, which Chromium allows only in fullscreen): turning the device
 * to aim must not turn the page. Call from a tap. Only on hand-held touch devices; every failure
 * is quiet (iOS Safari on phones has no element fullscreen).
 */
export async function enterTaskScreen(): Promise<void> {
  if (!handHeld()) return;
  try {
    if (!document.fullscreenElement && typeof document.documentElement.requestFullscreen === "function") {
      await document.documentElement.requestFullscreen({ navigationUI: "hide" });
    }
    const o = screen.orientation as LockableOrientation | undefined;
    if (o && typeof o.lock === "function") await o.lock(o.type);
  } catch {
    /* not supported, or refused: the task runs in the page as it is */
  }
}

/** Leaves fullscreen (and with it the orientation lock) after the task. */
export function leaveTaskScreen(): void {
  try {
    (screen.orientation as LockableOrientation | undefined)?.unlock?.();
    if (document.fullscreenElement) void document.exitFullscreen().catch(() => undefined);
  } catch {
    /* nothing to leave */
  }
}

/**
 * Keeps the screen awake while `active` (W3C Screen Wake Lock): asked again whenever the page
 * becomes visible, since the browser releases the lock when the page is hidden.
 */
export function useWakeLock(active: boolean): void {
  useEffect(() => {
    if (!active || !("wakeLock" in navigator)) return;
    let sentinel: WakeLockSentinel | null = null, gone = false;
    const take = async (): Promise<void> => {
      if (document.visibilityState !== "visible" || gone) return;
      try {
        sentinel = await navigator.wakeLock.request("screen");
        if (gone) void sentinel.release();
      } catch {
        /* refused (battery saver) or not allowed here */
      }
    };
    const onVisible = (): void => void take();
    void take();
    document.addEventListener("visibilitychange", onVisible);
    return () => {
      gone = true;
      document.removeEventListener("visibilitychange", onVisible);
      void sentinel?.release().catch(() => undefined);
    };
  }, [active]);
}
