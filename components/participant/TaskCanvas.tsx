"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import { createMotionEngineFromValid } from "@/lib/motion/engineCore";
import type { TransferConfig } from "@/lib/motion/config";
import type { MotionSample } from "@/lib/motion/sample";
import { sampleRateReport } from "@/lib/motion/calibration/sampleRateReport";
import type { Point } from "@/lib/task/point";
import { isInsideTarget, sequenceLayout } from "@/lib/runner/geometry";
import { pixelsPerTaskUnit, type DisplayCalibration } from "@/lib/runner/calibration";
import { createSequenceRecorder, type RecordedMovement } from "@/lib/runner/sequenceRecorder";
import { projectDirection, VIEW_VERTICAL_FOV_DEG } from "@/lib/runner/perspective";
import { controlHelp, controlMasks, controlSet, type ControlContext } from "@/lib/runner/controls";
import { createInputAgeLog } from "@/lib/runner/inputAge";
import { inputPathsFor } from "@/lib/runner/inputPaths";
import { layoutFit, type FitVerdict } from "@/lib/runner/fit";
import type { SequenceQuality } from "@/lib/runner/batch";
import { formatSampleCsv } from "@/lib/motion/csvFormat";
import { moveShownPosition } from "@/lib/motion/shownPosition";
import { gzipText } from "./gzip";
import { openTaskInputs } from "./inputs";
import { TaskControls, type ControlKind } from "./TaskControls";

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

const FRAME_LOG = 4096;
/** How long the mark of a selection stays, fading out (ms): one smooth fade, never a flash. */
const SELECTION_MARK_MS = 400;

/** Frame work times and input ages of the last sequences (test builds: read by the frame benchmark). */
declare global {
  interface Window {
    __yawpointFrames?: { workMs: number[]; delivered: number; recorded: number; engineDropped: number; apis: string[]; rateHz: number; ageMedianMs: number | null; ageP95Ms: number | null }[];
  }
}

function percentile99(values: Float64Array, n: number): number | null {
  if (n === 0) return null;
  const a = Array.from(values.subarray(0, n)).sort((x, y) => x - y);
  return a[Math.min(n - 1, Math.ceil(0.99 * n) - 1)]!;
}

const round3 = (x: number): number => Math.round(x * 1000) / 1000;

/** What this device offers, for the control hints (a fine pointer usually comes with a keyboard). */
function deviceContext(required: boolean): ControlContext {
  const pads = typeof navigator.getGamepads === "function" ? Array.from(navigator.getGamepads()) : [];
  return { touchScreen: navigator.maxTouchPoints > 0, keyboard: window.matchMedia("(pointer: fine)").matches, controller: required || pads.some((p) => p !== null) };
}

/**
 * One sequence of the pointing task on a canvas, drawn at the display's refresh. The technique's
 * inputs (inputs.ts) feed the engine sample by sample; a selection takes effect on a sample of
 * the recorded stream (marked `selected`), so a replay of the stream through the same
 * configuration puts every selection where the participant made it.
 */
export function TaskCanvas(props: {
  setup: TaskSetup;
  onMovement: (m: RecordedMovement) => void;
  onFinished: (f: FinishedSequence) => void;
  /** Sees every sample the task's engine gets (the design page's "try this level" reading). */
  onSample?: (s: MotionSample) => void;
}) {
  const { setup } = props;
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const boxRef = useRef<HTMLDivElement>(null);
  const controlRef = useRef<(kind: ControlKind, down: boolean, tMs: number) => void>(() => undefined);
  const cbRef = useRef(props);
  cbRef.current = props;
  const [fit, setFit] = useState<FitVerdict | null>(null);
  const [locked, setLocked] = useState(false);
  const [waiting, setWaiting] = useState(true);
  const technique = setup.config.technique;
  const paths = inputPathsFor(technique, setup.displayMode);
  const controls = controlSet(technique, setup.config, setup.selection);
  const [ctx, setCtx] = useState<ControlContext>({ touchScreen: false, keyboard: true, controller: paths.gamepad === "required" });
  useEffect(() => setCtx(deviceContext(paths.gamepad === "required")), [paths.gamepad]);
  const help = useMemo(() => controlHelp(technique, setup.config, setup.selection, setup.selectButton, setup.dwellMs, setup.displayMode, ctx), [technique, setup, ctx]);

  // Before drawing: do the ring and its targets fit this task area? (cursor mode; view mode turns to find them)
  useEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const check = (): void => {
      if (setup.displayMode === "view") return setFit({ fits: true });
      const r = box.getBoundingClientRect();
      const scale = pixelsPerTaskUnit(setup.unit, setup.amplitude, setup.calibration);
      // turned, the window's sides swap while the page's bars (header, hints, controls) keep their size
      const barsW = window.innerWidth - r.width, barsH = window.innerHeight - r.height;
      const turned = { width: window.innerHeight - barsW, height: window.innerWidth - barsH };
      const verdict = layoutFit(sequenceLayout(setup.type, setup.targetsPerRing, setup.amplitude, setup.width), scale, r.width, r.height, turned);
      setFit((old) => (old && old.fits === verdict.fits && (old.fits || (!verdict.fits && old.advice === verdict.advice)) ? old : verdict));
    };
    check();
    const ro = new ResizeObserver(check);
    ro.observe(box);
    return () => ro.disconnect();
  }, [setup]);

  const running = fit?.fits === true;
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!running || !canvas) return;
    const ctx2d = canvas.getContext("2d", { alpha: false });
    if (!ctx2d) return;
    const view = setup.displayMode === "view";
    // view mode: targets, A and W on the view sphere (great-circle angles; science.md §1 "View mode")
    const layout = sequenceLayout(setup.type, setup.targetsPerRing, setup.amplitude, setup.width, view ? "sphere" : "plane");
    const recorder = createSequenceRecorder(layout, setup.timeLimitMs);
    const engine = createMotionEngineFromValid({ ...setup.config, displayMode: setup.displayMode });
    const scale = view ? 1 : pixelsPerTaskUnit(setup.unit, setup.amplitude, setup.calibration);
    const masks = controlMasks(setup.config, setup.selectButton);
    const samples: MotionSample[] = [];
    const ages = createInputAgeLog();
    const work = new Float64Array(FRAME_LOG);
    let frames = 0, raf = 0, finished = false, prevPadSelect = false, dwellSince: number | null = null, waitingNow = true, lockFailed = false, repeating = false;
    let held = 0, keyClutch = false, keyAim = false, mouseAim = false, screenClutch = false, screenAim = false;
    let mark: { x: number; y: number; hit: boolean; at: number } | null = null;
    let w = 0, h = 0;
    const bounds = { width: 0, height: 0 };
    const pos = { x: 0, y: 0 }; // cursor: canvas px; view: yaw/pitch deg
    const tmp = { x: 0, y: 0 }, tmp2 = { x: 0, y: 0 };

    const resize = (): void => {
      const r = canvas.getBoundingClientRect();
      const dpr = window.devicePixelRatio || 1;
      w = bounds.width = r.width;
      h = bounds.height = r.height;
      canvas.width = Math.round(w * dpr);
      canvas.height = Math.round(h * dpr);
      ctx2d.setTransform(dpr, 0, 0, dpr, 0, 0);
    };
    resize();
    const toCanvas = (p: Point): Point => ({ x: w / 2 + p.x * scale, y: h / 2 + p.y * scale });
    const taskPoint = (): Point => (view ? { x: pos.x, y: pos.y } : { x: (pos.x - w / 2) / scale, y: (pos.y - h / 2) / scale });
    const start = view ? layout.order[0]! : toCanvas(layout.order[0]!);
    pos.x = start.x;
    pos.y = start.y;
    // absolute touch positions are in canvas px: the engine's output starts at the first target (a replay takes --start)
    if (!view) engine.setPosition(start.x, start.y);
    // for people and tests: the targets in the engine's units (cursor: canvas px, y down; view: deg, y up)
    canvas.dataset.targets = JSON.stringify(layout.order.map((p) => (view ? p : toCanvas(p))));

    const inputs = openTaskInputs(window, {
      technique: setup.config.technique, displayMode: setup.displayMode, surface: canvas,
      onTap: setup.selection === "tap" || setup.selection === "click" ? (t) => select(t) : undefined,
      onTouchDown: setup.selection === "tap" || setup.selection === "click" ? (t) => select(t) : undefined,
      onLockChange: (l) => setLocked(l),
    });

    const finish = (): void => {
      if (finished) return;
      finished = true;
      inputs.stop();
      const report = samples.length >= 3 ? sampleRateReport(samples.map((s) => s.tMs)) : null;
      const age = ages.summary();
      const quality: SequenceQuality = {
        sampleRateHz: report ? Math.round(report.meanRateHz * 10) / 10 : 0,
        jitterSdMs: report ? round3(report.jitterSdMs) : 0,
        gaps: report ? report.gaps : 0,
        droppedSamples: Math.max(0, inputs.delivered - samples.length) + engine.dropped,
        frameP99Ms: percentile99(work, Math.min(frames, FRAME_LOG)),
        inputApis: [...inputs.apis],
        requestedRateHz: inputs.requestedRateHz,
        pointerLockRaw: inputs.pointerLockRaw,
        inputAgeMedianMs: age ? round3(age.medianMs) : null,
        inputAgeP95Ms: age ? round3(age.p95Ms) : null,
        accelerometerInverted: setup.config.accelerometerInverted,
        canvasWidthPx: round3(w),
        canvasHeightPx: round3(h),
        startX: round3(start.x),
        startY: round3(start.y),
      };
      if (process.env.NEXT_PUBLIC_YAWPOINT_TEST_SOURCES === "1") {
        (window.__yawpointFrames ??= []).push({
          workMs: Array.from(work.subarray(0, Math.min(frames, FRAME_LOG))), delivered: inputs.delivered, recorded: samples.length, engineDropped: engine.dropped,
          apis: [...inputs.apis], rateHz: quality.sampleRateHz, ageMedianMs: quality.inputAgeMedianMs ?? null, ageP95Ms: quality.inputAgeP95Ms ?? null,
        });
      }
      const movements = [...recorder.movements];
      void gzipText(formatSampleCsv(samples)).then((streamGzip) => cbRef.current.onFinished({ movements, samples, streamGzip, quality }));
    };

    /**
     * A selection at time tMs where the aim is now. A participant's selection takes effect on the
     * last sample (for the pointer clock a still sample is made for it) and marks it `selected`;
     * a second selection before the next sample (a double tap) gets a repeat of that sample at
     * the same time, which moves nothing. A time-out is no selection of theirs and marks nothing.
     */
    const select = (tMs: number, timedOut = false): void => {
      if (finished || recorder.finished) return;
      if (!timedOut) {
        inputs.still(tMs);
        const last = samples[samples.length - 1];
        if (!last) return; // no input yet: nothing to select with
        if (last.selected === 1) {
          const { pointerDx: _dx, pointerDy: _dy, pointerX: _x, pointerY: _y, selected: _s, ...same } = last;
          repeating = true;
          onSample(same);
          repeating = false;
        }
        samples[samples.length - 1]!.selected = 1;
      }
      const t = Math.max(tMs, recorder.lastSelectionMs ?? tMs);
      const p = taskPoint();
      const row = recorder.select(t, p, { timedOut });
      dwellSince = null;
      mark = { x: view ? w / 2 : pos.x, y: view ? h / 2 : pos.y, hit: row ? row.hit === 1 : true, at: performance.now() };
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
      if (setup.selection === "dwell" && samples.length > 0) {
        if (insideNext()) {
          if (dwellSince === null) dwellSince = tMs;
          else if (tMs - dwellSince >= setup.dwellMs) select(tMs);
        } else dwellSince = null;
      }
    };

    const onSample = (s: MotionSample): void => {
      if (finished) return;
      const padSelect = ((s.buttons ?? 0) & masks.select) !== 0;
      samples.push(s);
      if (waitingNow) {
        waitingNow = false;
        setWaiting(false);
      }
      if (!repeating) cbRef.current.onSample?.(s);
      const out = engine.push(s);
      if (out) {
        // recenter resets the engine's orientation reference only: the aim stays where it is
        if (out.recentered) recorder.noteRecenter();
        // the cursor stays in the task area; the engine learns where it is shown (a replay does the same with --bounds)
        moveShownPosition(pos, out, view ? null : bounds, engine);
      }
      if (out?.clutched) recorder.noteClutch();
      if (!repeating) ages.arrived(inputs.lastInputMs);
      const rising = padSelect && !prevPadSelect;
      prevPadSelect = padSelect;
      if (rising && setup.selection === "button") select(s.tMs);
      else checkTimers(s.tMs);
    };

    const updateControls = (tMs: number): void => {
      const mask = ((keyClutch || screenClutch ? masks.clutch : 0) | (keyAim || mouseAim || screenAim ? masks.aim : 0)) >>> 0;
      if (mask !== held) {
        held = mask;
        inputs.setControls(mask, tMs);
      }
    };
    controlRef.current = (kind, down, tMs) => {
      if (kind === "select" && down) select(tMs);
      else if (kind === "recenter" && down && masks.recenter) inputs.pulse(masks.recenter, tMs);
      else if (kind === "pause") {
        screenClutch = down;
        updateControls(tMs);
      } else if (kind === "aim") {
        screenAim = down;
        updateControls(tMs);
      }
    };

    // selection by pointer where the technique has no pointer channel of its own (motion, stick, tilt)
    const onPointerDown = (e: PointerEvent): void => {
      if (finished) return;
      if (paths.pointer === "lock") {
        if (document.pointerLockElement !== canvas && !lockFailed) {
          // a click while unlocked takes the pointer and selects nothing; without Pointer Lock, clicks select
          void inputs.lock().then((ok) => (lockFailed = !ok));
          return;
        }
        if (e.button === 2) {
          mouseAim = true;
          updateControls(e.timeStamp);
        } else if (e.button === 0 && setup.selection !== "dwell") select(e.timeStamp);
        return;
      }
      // the right mouse button is the aim control (while-aiming), never a selection
      if (e.pointerType === "mouse" && e.button === 2) {
        mouseAim = true;
        updateControls(e.timeStamp);
        return;
      }
      if (paths.pointer === "none" && (setup.selection === "tap" || setup.selection === "click")) select(e.timeStamp);
    };
    const onPointerUp = (e: PointerEvent): void => {
      if (e.button === 2 && (paths.pointer === "lock" || e.pointerType === "mouse")) {
        mouseAim = false;
        updateControls(e.timeStamp);
      }
    };
    const onContextMenu = (e: Event): void => e.preventDefault();
    const onKey = (e: KeyboardEvent): void => {
      const down = e.type === "keydown";
      if (e.key === "Shift") {
        keyClutch = down;
        updateControls(e.timeStamp);
        return;
      }
      if (e.code === "KeyA") {
        keyAim = down;
        updateControls(e.timeStamp);
        return;
      }
      if (!down || e.repeat) return;
      if (e.code === "KeyR" && controls.recenter && masks.recenter) inputs.pulse(masks.recenter, e.timeStamp);
      if ((e.key === " " || e.key === "Enter") && setup.selection !== "dwell") {
        e.preventDefault();
        select(e.timeStamp);
      }
    };

    const draw = (): void => {
      const t0 = performance.now();
      inputs.poll(t0); // the controller is read here, before the frame is drawn
      checkTimers(t0);
      ctx2d.fillStyle = "#f8fafc";
      ctx2d.fillRect(0, 0, w, h);
      const next = recorder.next;
      const nextPoint = layout.order[next];
      for (let i = 0; i < layout.all.length; i++) {
        const t = layout.all[i]!;
        const isNext = nextPoint !== undefined && t.x === nextPoint.x && t.y === nextPoint.y;
        let cx: number, cy: number, r: number;
        if (view) {
          if (!projectDirection(t.x, t.y, pos.x, pos.y, VIEW_VERTICAL_FOV_DEG, w, h, tmp)) continue;
          // a pitch offset of W/2 is W/2 on a great circle at any pitch (a yaw offset would shrink by cos(pitch))
          projectDirection(t.x, t.y + setup.width / 2, pos.x, pos.y, VIEW_VERTICAL_FOV_DEG, w, h, tmp2);
          cx = tmp.x;
          cy = tmp.y;
          r = Math.max(2, Math.hypot(tmp2.x - tmp.x, tmp2.y - tmp.y));
        } else {
          cx = w / 2 + t.x * scale;
          cy = h / 2 + t.y * scale;
          r = (setup.width * scale) / 2;
        }
        ctx2d.beginPath();
        if (setup.type === "ring") ctx2d.arc(cx, cy, r, 0, 2 * Math.PI);
        else ctx2d.rect(cx - r, 0, 2 * r, h);
        ctx2d.fillStyle = isNext ? "#3b82f6" : "#e2e8f0";
        ctx2d.fill();
        ctx2d.lineWidth = isNext ? 3 : 1;
        ctx2d.strokeStyle = isNext ? "#0f172a" : "#94a3b8";
        ctx2d.stroke();
        if (isNext) {
          canvas.dataset.nextX = cx.toFixed(1);
          canvas.dataset.nextY = cy.toFixed(1);
        }
      }
      canvas.dataset.trial = String(next);
      const cx = view ? w / 2 : pos.x, cy = view ? h / 2 : pos.y;
      canvas.dataset.aimX = cx.toFixed(1);
      canvas.dataset.aimY = cy.toFixed(1);
      // hit feedback: a small ring at the selection, fading out once (no flashing)
      if (mark) {
        const left = 1 - (t0 - mark.at) / SELECTION_MARK_MS;
        if (left <= 0) mark = null;
        else {
          ctx2d.globalAlpha = left;
          ctx2d.strokeStyle = mark.hit ? "#15803d" : "#64748b";
          ctx2d.lineWidth = 2;
          ctx2d.beginPath();
          ctx2d.arc(mark.x, mark.y, 14, 0, 2 * Math.PI);
          ctx2d.stroke();
          ctx2d.globalAlpha = 1;
        }
      }
      ctx2d.strokeStyle = "#b91c1c";
      ctx2d.lineWidth = 2;
      ctx2d.beginPath();
      ctx2d.moveTo(cx - 8, cy);
      ctx2d.lineTo(cx + 8, cy);
      ctx2d.moveTo(cx, cy - 8);
      ctx2d.lineTo(cx, cy + 8);
      ctx2d.stroke();
      ages.drawn(t0);
      if (frames < FRAME_LOG) work[frames] = performance.now() - t0;
      frames++;
      if (!finished) raf = requestAnimationFrame(draw);
    };

    canvas.addEventListener("pointerdown", onPointerDown);
    canvas.addEventListener("pointerup", onPointerUp);
    canvas.addEventListener("contextmenu", onContextMenu);
    window.addEventListener("keydown", onKey);
    window.addEventListener("keyup", onKey);
    window.addEventListener("resize", resize);
    raf = requestAnimationFrame(draw);
    void inputs.start(onSample).catch(() => undefined);
    return () => {
      finished = true;
      cancelAnimationFrame(raf);
      inputs.stop();
      controlRef.current = () => undefined;
      canvas.removeEventListener("pointerdown", onPointerDown);
      canvas.removeEventListener("pointerup", onPointerUp);
      canvas.removeEventListener("contextmenu", onContextMenu);
      window.removeEventListener("keydown", onKey);
      window.removeEventListener("keyup", onKey);
      window.removeEventListener("resize", resize);
    };
    // paths and controls follow from setup
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [setup, running]);

  const lockHint = paths.pointer === "lock" && !locked;
  return (
    <div className="flex h-full flex-col">
      <p className="px-3 pb-1 text-sm" data-testid="control-hint"><strong>Select:</strong> {help.select}.</p>
      <div ref={boxRef} className="relative min-h-0 flex-1" style={{ minHeight: 240 }}>
        {running ? (
          <canvas ref={canvasRef} data-testid="task-canvas" aria-label="Pointing task: select the highlighted target"
            className="absolute inset-0 block h-full w-full touch-none select-none" style={{ cursor: paths.pointer === "lock" && locked ? "none" : "crosshair" }} />
        ) : fit && !fit.fits ? (
          <div className="notice m-3" role="alert" data-testid="fit-warning">
            <p className="font-semibold">The targets do not fit on this screen.</p>
            <p>{fit.advice === "rotate"
              ? "Please turn your device sideways (or upright): then they fit."
              : `They need an area of about ${fit.neededPx.width} × ${fit.neededPx.height} pixels. Please use a larger screen (a tablet or a computer), or make this window larger.`}</p>
          </div>
        ) : null}
        {running && lockHint && (
          <p className="pointer-events-none absolute inset-x-0 top-2 mx-auto w-fit rounded bg-white/90 px-2 text-sm" data-testid="lock-hint">Click the task area to start aiming with the mouse (Esc gives the pointer back).</p>
        )}
        {running && waiting && paths.motion && (
          <p className="pointer-events-none absolute inset-x-0 bottom-2 mx-auto w-fit rounded bg-white/90 px-2 text-sm">Waiting for the motion sensors…</p>
        )}
      </div>
      {running && <TaskControls set={controls} touchScreen={ctx.touchScreen} onControl={(kind, down, tMs) => controlRef.current(kind, down, tMs)} />}
    </div>
  );
}
