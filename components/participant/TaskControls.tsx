"use client";
import type { ControlSet } from "@/lib/runner/controls";

export type ControlKind = "select" | "pause" | "aim" | "recenter";

/**
 * On-screen controls of the task for touch screens, inside the screen's safe area (notches,
 * rounded corners, the home indicator): Select and Recenter act on a press; Pause (the clutch)
 * and Aim act while held. Each reports its pointer event's time stamp.
 */
export function TaskControls(props: { set: ControlSet; touchScreen: boolean; onControl: (kind: ControlKind, down: boolean, tMs: number) => void }) {
  const { set, touchScreen, onControl } = props;
  if (!touchScreen || !(set.select || set.clutch || set.aim || set.recenter)) return null;
  const hold = (kind: ControlKind, label: string) => (
    <button type="button" className="btn-secondary min-h-14 flex-1 touch-none select-none" data-testid={`control-${kind}`}
      onPointerDown={(e) => {
        e.currentTarget.setPointerCapture(e.pointerId);
        onControl(kind, true, e.timeStamp);
      }}
      onPointerUp={(e) => onControl(kind, false, e.timeStamp)} onPointerCancel={(e) => onControl(kind, false, e.timeStamp)}
      onContextMenu={(e) => e.preventDefault()}>
      {label}
    </button>
  );
  const press = (kind: ControlKind, label: string) => (
    <button type="button" className="btn-secondary min-h-14 flex-1 touch-none select-none" data-testid={`control-${kind}`}
      onPointerDown={(e) => onControl(kind, true, e.timeStamp)} onContextMenu={(e) => e.preventDefault()}>
      {label}
    </button>
  );
  return (
    <div className="flex gap-2 pt-2" style={{ paddingLeft: "max(0.5rem, env(safe-area-inset-left))", paddingRight: "max(0.5rem, env(safe-area-inset-right))", paddingBottom: "max(0.5rem, env(safe-area-inset-bottom))" }}>
      {set.clutch && hold("pause", "Hold to pause")}
      {set.aim && hold("aim", "Hold to aim")}
      {set.recenter && press("recenter", "Recenter")}
      {set.select && press("select", "Select")}
    </div>
  );
}
