"use client";

import { useEffect, useMemo } from "react";
import type { StudyDesign } from "@/lib/study/design";
import { fitReport, FIT_MARGIN_PX, VIEW_VERTICAL_FOV_DEG } from "@/lib/study/checks";
import type { ChecksAnswer } from "./checksProtocol";
import { progressText, useChecksWorker } from "./useChecksWorker";

const fmtMm = (x: number | null) => (x === null ? "–" : `${x.toFixed(1)} mm`);

/** Fit of every A×W on each device class the study allows, the smallest target in mm, and the expected minutes. */
export function FitTimeChecks({ design }: { design: StudyDesign }) {
  const fit = useMemo(() => fitReport(design), [design]);
  const time = useChecksWorker<Extract<ChecksAnswer, { kind: "time" }>>();
  const { run } = time;
  useEffect(() => {
    const h = setTimeout(() => run({ kind: "time", design }), 400);
    return () => clearTimeout(h);
  }, [design, run]);
  const t = time.answer?.kind === "time" ? time.answer.result : null;
  const view = design.task.displayMode === "view";
  return (
    <section className="card space-y-3 text-sm" aria-labelledby="checks-title">
      <h3 id="checks-title" className="text-base font-semibold">Screens and time</h3>
      {fit.warnings.length > 0 ? (
        <div className="notice space-y-1" role="alert" aria-label="Fit warnings">
          <p><strong>Some targets do not fit.</strong> Make A or W smaller, use mm or visual degrees so sizes follow the screen, or tell participants which devices to use.</p>
          <ul className="list-disc pl-5">{fit.warnings.map((w) => <li key={w}>{w}</li>)}</ul>
        </div>
      ) : <p aria-label="Fit result">Every A×W fits every device class this study&apos;s techniques allow.</p>}
      <table aria-label="Fit per device">
        <thead><tr><th>A × W ({design.task.unit})</th>{fit.devices.map((d) => <th key={d.id}>{d.label}</th>)}</tr></thead>
        <tbody>
          {fit.rows.map((r) => (
            <tr key={`${r.amplitude}-${r.width}`}><td>{r.amplitude} × {r.width}</td>
              {r.results.map((x) => <td key={x.device}>{x.fits ? "fits" : "does not fit"} <span className="text-xs text-slate-600">({x.needed.toFixed(0)} / {x.available.toFixed(0)} {view ? "°" : "px"})</span></td>)}
            </tr>
          ))}
          <tr><td>smallest target</td>{fit.smallestTargetMm.map((m, i) => <td key={fit.devices[i]!.id}>{fmtMm(m)}</td>)}</tr>
        </tbody>
      </table>
      <p className="text-xs text-slate-600">
        Screens assumed (our planning figures, from common devices): {fit.devices.map((d) => `${d.label} ${d.widthPx} × ${d.heightPx} CSS px, ${d.pixelsPerMm} px/mm, viewed at ${d.viewingDistanceMm / 10} cm`).join("; ")}.
        {view ? ` View mode: the ring must lie within the runner's field of view (${VIEW_VERTICAL_FOV_DEG}° vertical) to be seen whole.` : ` Ring: its diameter A / cos(π/2n) plus W across the smaller side, ${FIT_MARGIN_PX} px kept clear at each edge.`}
        {" "}Device classes follow the techniques: motion on phones, tablets and a laptop with a controller; touch and tilt on phones and tablets; mouse and stick on a laptop.
      </p>
      <div aria-label="Expected time" className="space-y-1">
        {t && <p><strong>About {t.minutes} minutes per session</strong>, from the simulated participant at each condition&apos;s settings (Fitts&apos; law with a = 300 ms, b = 150 ms/bit, plus the still time that latency and smoothing add), with {Math.round(t.otherSeconds / 60)} min of sequence starts, breaks, questions and set-up.</p>}
        {t && (
          <p className="text-xs text-slate-600">Mean movement time: {t.conditions.map((c) => `${c.label} ${Math.round(c.meanMovementMs)} ms${c.method === "simulated" ? "" : " (timing model only: no sensor stream for this technique yet)"}`).join("; ")}.</p>
        )}
        {time.progress && <p className="text-xs">Estimating the time… <progress max={time.progress.total} value={time.progress.done} aria-label={progressText(time.progress)} /></p>}
        {time.answer?.kind === "error" && <p className="field-error">{time.answer.message}</p>}
      </div>
      <p className="text-xs text-slate-600">Cautions: repeated wrist rotation can strain and view rotation can cause motion sickness; long sessions need breaks. Keep sessions short and follow your ethics board.</p>
    </section>
  );
}
