"use client";

import { useEffect, useMemo, useState } from "react";
import { TaskCanvas, type TaskSetup } from "@/components/participant/TaskCanvas";
import { askMotionPermission } from "@/components/participant/motionPermission";
import { usesMotion } from "@/lib/runner/inputPaths";
import { selectButtonFor } from "@/lib/runner/selectButton";
import type { TrySetup } from "@/lib/study/trySetup";
import { createDisplacementMeter, type MeterReading } from "./displacementMeter";

/** The browser's nominal CSS scale (96 px per inch) and a desk distance: sizes for a try only; participants calibrate their own. */
const NOMINAL = { pixelsPerMm: 96 / 25.4, viewingDistanceMm: 550 };

/** One level in the real runner's task, with a live reading of what the input did. Nothing is recorded. */
export function TryLevel({ setup, expiresAt }: { setup: TrySetup; expiresAt: string }) {
  const { config, task } = setup;
  const motion = usesMotion(config.technique);
  const pairs = useMemo(() => task.amplitudes.flatMap((a) => task.widths.map((w) => ({ a, w }))), [task]);
  const [pair, setPair] = useState(0);
  const [run, setRun] = useState(0);
  const [started, setStarted] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [reading, setReading] = useState<MeterReading>({ deviceDeg: 0, dx: 0, dy: 0 });
  const [moves, setMoves] = useState({ n: 0, hits: 0 });
  const meter = useMemo(() => createDisplacementMeter({ ...config, displayMode: task.displayMode }), [config, task.displayMode]);

  useEffect(() => {
    if (!started) return;
    const h = setInterval(() => setReading(meter.read()), 100);
    return () => clearInterval(h);
  }, [started, meter]);

  const start = async () => {
    setError(null);
    try {
      // asks for motion permission inside this tap (iOS); the task then reads the sensors itself
      if (motion && (await askMotionPermission()) === "denied") throw new Error("Motion sensors are not allowed in this browser: allow them in its site settings and start again.");
      meter.reset();
      setStarted(true);
      setRun((r) => r + 1);
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };

  // One setup object per A×W: the task restarts only when it changes (TaskCanvas re-runs on a new setup).
  const taskSetup = useMemo((): TaskSetup => {
    const p = pairs[pair]!;
    return {
      type: task.type, displayMode: task.displayMode, unit: task.unit, targetsPerRing: task.targetsPerRing,
      amplitude: p.a, width: p.w, selection: task.selection, dwellMs: task.dwellMs, timeLimitMs: task.trialTimeLimitMs,
      config: { ...config, displayMode: task.displayMode }, selectButton: selectButtonFor(config), calibration: NOMINAL,
    };
  }, [pairs, pair, task, config]);

  const unit = task.displayMode === "cursor" ? "px" : "°";
  const gainPerDeg = task.displayMode === "cursor" ? config.gain * config.pixelsPerDegree : config.gain;

  return (
    <main className="mx-auto max-w-5xl space-y-3 p-3">
      <header className="space-y-1">
        <h1>Trying: {setup.label}</h1>
        <p className="text-sm">The study&apos;s own task at this level&apos;s settings ({config.technique}, {task.displayMode} mode{motion ? `, gain ${config.gain}` : ""}). <strong>Nothing is recorded</strong>: no consent, no participant, no data. Works until {expiresAt.slice(11, 16)} UTC.</p>
        <p className="notice text-xs">Repeated wrist rotation can strain; view rotation can cause motion sickness; stop whenever you like.</p>
      </header>
      <div className="flex flex-wrap items-end gap-2 text-sm">
        {pairs.length > 1 && (
          <label className="flex items-center gap-1">A × W
            <select className="input w-auto" value={pair} onChange={(e) => { setPair(Number(e.target.value)); setRun((r) => r + 1); }}>
              {pairs.map((x, i) => <option key={i} value={i}>{x.a} × {x.w} {task.unit}</option>)}
            </select>
          </label>
        )}
        <button type="button" className="btn" onClick={() => void start()}>{started ? "Start again" : "Start"}</button>
        <button type="button" className="btn-secondary" onClick={() => { meter.reset(); setReading(meter.read()); }}>Reset the reading</button>
      </div>
      {error && <p className="field-error" role="alert">{error}</p>}
      <p className="text-sm" role="status" aria-label="Input reading" data-testid="try-reading">
        {motion
          ? <>Device turned <span data-testid="try-device-deg">{reading.deviceDeg.toFixed(1)}</span>°, the {task.displayMode === "cursor" ? "cursor" : "view"} moved <span data-testid="try-output">{Math.hypot(reading.dx, reading.dy).toFixed(task.displayMode === "cursor" ? 0 : 1)}</span> {unit} (at a constant gain: {gainPerDeg} {unit} per device degree).</>
          : <>Move the {config.technique === "mouse" ? "mouse" : "finger"} on the task to aim; click or tap to select.</>}
        {" "}<span data-testid="try-movements">{moves.n} movements, {moves.hits} hits</span> so far.
      </p>
      {started && (
        <div className="h-[70vh] w-full overflow-hidden rounded border border-slate-300">
          <TaskCanvas key={`${run}-${pair}`} setup={taskSetup} onSample={(s) => meter.push(s)} onMovement={(m) => setMoves((x) => ({ n: x.n + 1, hits: x.hits + m.hit }))} onFinished={() => setRun((r) => r + 1)} />
        </div>
      )}
    </main>
  );
}
