"use client";
import { useEffect, useRef } from "react";
import { createMotionEngineFromValid } from "@/lib/motion/engineCore";
import type { TransferConfig } from "@/lib/motion/config";
import type { MotionSample } from "@/lib/motion/sample";
import { sampleStreamCsv } from "./streamCsv";
import { sampleRateReport } from "@/lib/motion/calibration/sampleRateReport";
import type { Point } from "@/lib/task/point";
import { isInsideTarget, sequenceLayout } from "@/lib/runner/geometry";
import { pixelsPerTaskUnit, type DisplayCalibration } from "@/lib/runner/calibration";
import { createSequenceRecorder, type RecordedMovement } from "@/lib/runner/sequenceRecorder";
import { projectDirection } from "@/lib/runner/perspective";
import type { SequenceQuality } from "@/lib/runner/batch";
import { gzipText } from "./gzip";
import type { InputProvider } from "./inputs";

export interface TaskSetup {
  type: "ring" | "strip";
  displayMode: "cursor" | "view";
  unit: "px" | "mm" | "deg-visual" | "deg-view";
  targetsPerRing: number;
  amplitude: number;
  width: number;
  selection: "button" | "tap" | "click" | "dwell";
  dwellMs: number;
  timeLimitMs: number;
  config: TransferConfig;
  selectButton: number;
  calibration: DisplayCalibration;
}

export interface FinishedSequence {
  movements: RecordedMovement[];
  samples: MotionSample[];
  streamGzip: Uint8Array;
  quality: SequenceQuality;
}

const VERTICAL_FOV_DEG = 60;
const FRAME_LOG = 4096;

/** Frame work times of the last sequences (test builds: read by the frame benchmark). */
declare global {
  interface Window {
    __yawpointFrames?: { workMs: number[]; delivered: number; recorded: number; engineDropped: number }[];
  }
}

function percentile99(values: Float64Array, n: number): number | null {
  if (n === 0) return null;
  const a = Array.from(values.subarray(0, n)).sort((x, y) => x - y);
  return a[Math.min(n - 1, Math.ceil(0.99 * n) - 1)]!;
}

/** One sequence of the pointing task on a canvas, drawn at the display's refresh. */
export function TaskCanvas(props: { setup: TaskSetup; provider: InputProvider | null; onMovement: (m: RecordedMovement) => void; onFinished: (f: FinishedSequence) => void }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const clutchRef = useRef(0);
  const recenterRef = useRef(0);
  const { setup, provider } = props;
  const cbRef = useRef(props);
  cbRef.current = props;

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const ctx = canvas.getContext("2d", { alpha: false });
    if (!ctx) return;
    const pointerTechnique = setup.config.technique === "mouse" || setup.config.technique === "touch";
    const view = setup.displayMode === "view";
    // view mode: targets, A and W on the view sphere (great-circle angles; science.md §1 "View mode")
    const layout = sequenceLayout(setup.type, setup.targetsPerRing, setup.amplitude, setup.width, view ? "sphere" : "plane");
    const recorder = createSequenceRecorder(layout, setup.timeLimitMs);
    const engine = pointerTechnique ? null : createMotionEngineFromValid({ ...setup.config, displayMode: setup.displayMode });
    const scale = view ? 1 : pixelsPerTaskUnit(setup.unit, setup.amplitude, setup.calibration);
    const selectMask = 2 ** setup.selectButton;
    const samples: MotionSample[] = [];
    const work = new Float64Array(FRAME_LOG);
    let frames = 0, raf = 0, finished = false, prevButtons = 0, dwellSince: number | null = null;
    let w = 0, h = 0;
    const pos = { x: 0, y: 0 }; // cursor: canvas px; view: yaw/pitch deg
    const tmp = { x: 0, y: 0 }, tmp2 = { x: 0, y: 0 };

    const resize = (): void => {
      const r = canvas.getBoundingClientRect();
      const dpr = window.devicePixelRatio || 1;
      w = r.width;
      h = r.height;
      canvas.width = Math.round(w * dpr);
      canvas.height = Math.round(h * dpr);
      ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    };
    resize();
    const toCanvas = (p: Point): Point => ({ x: w / 2 + p.x * scale, y: h / 2 + p.y * scale });
    const taskPoint = (): Point => (view ? { x: pos.x, y: pos.y } : { x: (pos.x - w / 2) / scale, y: (pos.y - h / 2) / scale });
    const start = view ? layout.order[0]! : toCanvas(layout.order[0]!);
    pos.x = start.x;
    pos.y = start.y;

    const finish = (): void => {
      if (finished) return;
      finished = true;
      provider?.stop();
      const report = samples.length >= 3 ? sampleRateReport(samples.map((s) => s.tMs)) : null;
      const delivered = provider && !pointerTechnique ? provider.delivered : samples.length;
      const quality: SequenceQuality = {
        sampleRateHz: report ? Math.round(report.meanRateHz * 10) / 10 : 0,
        jitterSdMs: report ? Math.round(report.jitterSdMs * 1000) / 1000 : 0,
        gaps: report ? report.gaps : 0,
        droppedSamples: Math.max(0, delivered - samples.length) + (engine?.dropped ?? 0),
        frameP99Ms: percentile99(work, Math.min(frames, FRAME_LOG)),
      };
      if (process.env.NEXT_PUBLIC_YAWPOINT_TEST_SOURCES === "1") {
        (window.__yawpointFrames ??= []).push({ workMs: Array.from(work.subarray(0, Math.min(frames, FRAME_LOG))), delivered, recorded: samples.length, engineDropped: engine?.dropped ?? 0 });
      }
      const movements = [...recorder.movements];
      void gzipText(sampleStreamCsv(samples)).then((streamGzip) => cbRef.current.onFinished({ movements, samples, streamGzip, quality }));
    };

    const select = (tMs: number, timedOut = false): void => {
      if (finished || recorder.finished) return;
      const row = recorder.select(tMs, taskPoint(), { timedOut });
      dwellSince = null;
      if (row) cbRef.current.onMovement(row);
      if (recorder.finished) finish();
    };

    const insideNext = (): boolean => {
      const t = layout.order[recorder.next];
      if (!t) return false;
      const p = taskPoint();
      return isInsideTarget(layout.type, t, layout.axis, p, setup.width, layout.surface);
    };

    const checkTimers = (tMs: number): void => {
      const limit = recorder.timeoutAt();
      if (limit !== null && tMs >= limit) select(limit, true);
      if (setup.selection === "dwell") {
        if (insideNext()) {
          if (dwellSince === null) dwellSince = tMs;
          else if (tMs - dwellSince >= setup.dwellMs) select(tMs);
        } else dwellSince = null;
      }
    };

    const onSample = (raw: MotionSample): void => {
      if (finished || !engine) return;
      const s: MotionSample = { ...raw, buttons: (raw.buttons ?? 0) | clutchRef.current | recenterRef.current };
      recenterRef.current = 0;
      samples.push(s);
      const out = engine.push(s);
      if (out) {
        // recenter resets the engine's orientation reference only: the aim stays where it is
        if (out.recentered) recorder.noteRecenter();
        if (clutchRef.current !== 0) recorder.noteClutch();
        pos.x += out.dx;
        pos.y += out.dy;
        if (!view) {
          pos.x = Math.min(Math.max(pos.x, 0), w);
          pos.y = Math.min(Math.max(pos.y, 0), h);
        }
      }
      const b = s.buttons ?? 0;
      const pressed = (b & selectMask) !== 0 && (prevButtons & selectMask) === 0;
      prevButtons = b;
      if (pressed && setup.selection === "button") select(s.tMs);
      else checkTimers(s.tMs);
    };

    // pointer: selection by tap/click (motion techniques select at the cursor; pointer techniques where the pointer is)
    let lastPointer: Point | null = null;
    const pointerSample = (e: PointerEvent, buttons: number): void => {
      const r = canvas.getBoundingClientRect();
      const p = { x: e.clientX - r.left, y: e.clientY - r.top };
      const d = lastPointer ? { x: p.x - lastPointer.x, y: p.y - lastPointer.y } : { x: 0, y: 0 };
      lastPointer = p;
      samples.push({ tMs: e.timeStamp, gyroX: 0, gyroY: 0, gyroZ: 0, pointerDx: d.x, pointerDy: d.y, buttons });
      pos.x = p.x;
      pos.y = p.y;
    };
    const onPointerDown = (e: PointerEvent): void => {
      if (finished) return;
      if (pointerTechnique) pointerSample(e, 1);
      if (setup.selection === "tap" || setup.selection === "click" || pointerTechnique) select(e.timeStamp);
    };
    const onPointerMove = (e: PointerEvent): void => {
      if (!pointerTechnique || finished) return;
      const events = typeof e.getCoalescedEvents === "function" ? e.getCoalescedEvents() : [];
      for (const c of events.length > 0 ? events : [e]) pointerSample(c, e.buttons);
      checkTimers(e.timeStamp);
    };
    const onKey = (e: KeyboardEvent): void => {
      if (e.key === "Shift" && setup.config.clutchButton !== null) clutchRef.current = e.type === "keydown" ? 2 ** setup.config.clutchButton : 0;
      if (e.type !== "keydown" || e.repeat) return;
      if ((e.key === "r" || e.key === "R") && setup.config.recenterButton !== null) recenterRef.current = 2 ** setup.config.recenterButton;
      if ((e.key === " " || e.key === "Enter") && setup.selection !== "dwell") {
        e.preventDefault();
        select(e.timeStamp);
      }
    };

    const draw = (): void => {
      const t0 = performance.now();
      if (!pointerTechnique) checkTimers(t0);
      ctx.fillStyle = "#f8fafc";
      ctx.fillRect(0, 0, w, h);
      const next = recorder.next;
      const nextPoint = layout.order[next];
      for (let i = 0; i < layout.all.length; i++) {
        const t = layout.all[i]!;
        const isNext = nextPoint !== undefined && t.x === nextPoint.x && t.y === nextPoint.y;
        let cx: number, cy: number, r: number;
        if (view) {
          if (!projectDirection(t.x, t.y, pos.x, pos.y, VERTICAL_FOV_DEG, w, h, tmp)) continue;
          // a pitch offset of W/2 is W/2 on a great circle at any pitch (a yaw offset would shrink by cos(pitch))
          projectDirection(t.x, t.y + setup.width / 2, pos.x, pos.y, VERTICAL_FOV_DEG, w, h, tmp2);
          cx = tmp.x;
          cy = tmp.y;
          r = Math.max(2, Math.hypot(tmp2.x - tmp.x, tmp2.y - tmp.y));
        } else {
          cx = w / 2 + t.x * scale;
          cy = h / 2 + t.y * scale;
          r = (setup.width * scale) / 2;
        }
        ctx.beginPath();
        if (setup.type === "ring") ctx.arc(cx, cy, r, 0, 2 * Math.PI);
        else ctx.rect(cx - r, 0, 2 * r, h);
        ctx.fillStyle = isNext ? "#1d4ed8" : "#e2e8f0";
        ctx.fill();
        ctx.lineWidth = isNext ? 3 : 1;
        ctx.strokeStyle = isNext ? "#0f172a" : "#94a3b8";
        ctx.stroke();
        if (isNext) {
          canvas.dataset.nextX = cx.toFixed(1);
          canvas.dataset.nextY = cy.toFixed(1);
        }
      }
      canvas.dataset.trial = String(next);
      const cx = view ? w / 2 : pos.x, cy = view ? h / 2 : pos.y;
      ctx.strokeStyle = "#b91c1c";
      ctx.lineWidth = 2;
      ctx.beginPath();
      ctx.moveTo(cx - 8, cy);
      ctx.lineTo(cx + 8, cy);
      ctx.moveTo(cx, cy - 8);
      ctx.lineTo(cx, cy + 8);
      ctx.stroke();
      if (frames < FRAME_LOG) work[frames] = performance.now() - t0;
      frames++;
      if (!finished) raf = requestAnimationFrame(draw);
    };

    canvas.addEventListener("pointerdown", onPointerDown);
    canvas.addEventListener("pointermove", onPointerMove);
    window.addEventListener("keydown", onKey);
    window.addEventListener("keyup", onKey);
    window.addEventListener("resize", resize);
    raf = requestAnimationFrame(draw);
    if (provider && !pointerTechnique) {
      const targets = layout.order.map((p) => (view ? p : toCanvas(p)));
      void provider.start(onSample, { targets, amplitude: setup.amplitude * scale, width: setup.width * scale, config: { ...setup.config, displayMode: setup.displayMode }, selectButton: setup.selectButton });
    }
    return () => {
      finished = true;
      cancelAnimationFrame(raf);
      provider?.stop();
      canvas.removeEventListener("pointerdown", onPointerDown);
      canvas.removeEventListener("pointermove", onPointerMove);
      window.removeEventListener("keydown", onKey);
      window.removeEventListener("keyup", onKey);
      window.removeEventListener("resize", resize);
    };
  }, [setup, provider]);

  const motion = !(setup.config.technique === "mouse" || setup.config.technique === "touch");
  return (
    <div className="flex h-full flex-col">
      <canvas ref={canvasRef} data-testid="task-canvas" aria-label="Pointing task: select the highlighted target" className="block w-full flex-1 touch-none select-none" style={{ minHeight: 320 }} />
      {motion && (setup.config.clutchButton !== null || setup.config.recenterButton !== null) && (
        <div className="flex gap-2 p-2">
          {setup.config.clutchButton !== null && (
            <button type="button" className="btn-secondary flex-1"
              onPointerDown={() => (clutchRef.current = 2 ** setup.config.clutchButton!)}
              onPointerUp={() => (clutchRef.current = 0)} onPointerCancel={() => (clutchRef.current = 0)} onPointerLeave={() => (clutchRef.current = 0)}>
              Hold to pause motion
            </button>
          )}
          {setup.config.recenterButton !== null && (
            <button type="button" className="btn-secondary flex-1" onClick={() => (recenterRef.current = 2 ** setup.config.recenterButton!)}>Recenter</button>
          )}
        </div>
      )}
    </div>
  );
}
