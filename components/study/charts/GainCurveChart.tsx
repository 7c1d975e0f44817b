"use client";

import { useMemo, useState } from "react";
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { TransferConfig } from "@/lib/motion/config";
import { gainCurvePoints } from "@/lib/study/curves";
import { seriesStyle } from "@/components/results/chartStyle";
import { Figure } from "@/components/results/Figure";

/** The device speed at which the caption reads each curve, °/s (a steady aiming turn). */
export const CAPTION_SPEED = 30;

/** Output speed against device speed for each condition with motion, with dead band, fine-aim smoothing and the curve's speeds marked. */
export function GainCurveChart({ conditions }: { conditions: { label: string; config: TransferConfig }[] }) {
  const motion = conditions.filter((c) => c.config.technique === "motion" || c.config.technique === "motion+stick" || c.config.technique === "motion+touch");
  const [marked, setMarked] = useState(0);
  const maxSpeed = useMemo(() => Math.max(60, ...motion.map((c) => 1.5 * Math.max(c.config.gainCurve === "two-level" ? c.config.deadBandDegPerS + c.config.curveFastSpeedDegPerS : 0, c.config.gainCurve === "power" ? c.config.curveReferenceSpeedDegPerS : 0, c.config.smoothingTimeMs > 0 ? c.config.smoothingSpeedDegPerS : 0))), [motion]);
  const curves = useMemo(() => motion.map((c) => ({ label: c.label, curve: gainCurvePoints(c.config, maxSpeed, 120) })), [motion, maxSpeed]);
  if (curves.length === 0) return null;
  const unit = curves[0]!.curve.unit;
  const data = curves[0]!.curve.points.map((p, i) => Object.fromEntries([["device", p.device], ...curves.map((c) => [c.label, c.curve.points[i]!.output])]));
  const m = curves[Math.min(marked, curves.length - 1)]!.curve;
  const at = (label: string): number => {
    const c = motion.find((x) => x.label === label)!;
    return gainCurvePoints(c.config, CAPTION_SPEED, 1).points[1]!.output;
  };
  return (
    <Figure id="gain-curve" title="Output speed against device speed (motion)" caption={
      <>
        How fast the {unit === "px/s" ? "cursor" : "view"} moves ({unit}) for each device speed (°/s), computed with the engine&apos;s own stages. Shaded: the dead band (no output) and where fine-aim smoothing acts; dashed: the two-level curve&apos;s slow and fast speeds, for the marked condition.{" "}
        <span data-testid="gain-curve-readout">At {CAPTION_SPEED} °/s: {curves.map((c, i) => `${i ? "; " : ""}${c.label} → ${Math.round(at(c.label) * 10) / 10} ${unit}`).join("")}.</span>
      </>
    }>
      {curves.length > 1 && (
        <label className="mb-1 flex items-center gap-2 text-xs font-normal">Marks for
          <select className="input w-auto py-0.5 text-xs" value={marked} onChange={(e) => setMarked(Number(e.target.value))}>{curves.map((c, i) => <option key={c.label} value={i}>{c.label}</option>)}</select>
        </label>
      )}
      <ResponsiveContainer width="100%" height={300}>
        <LineChart data={data} margin={{ top: 12, right: 16, bottom: 28, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" />
          <XAxis type="number" dataKey="device" domain={[0, maxSpeed]} tick={{ fontSize: 12 }} label={{ value: "device speed (°/s)", position: "insideBottom", offset: -16, fontSize: 12 }} />
          <YAxis type="number" tick={{ fontSize: 12 }} label={{ value: `output (${unit})`, angle: -90, position: "insideLeft", fontSize: 12 }} />
          {m.deadBand > 0 && <ReferenceArea x1={0} x2={m.deadBand} fill="#94a3b8" fillOpacity={0.35} label={{ value: "dead band", fontSize: 11, position: "insideTop" }} />}
          {m.smoothingBelow !== null && <ReferenceArea x1={m.deadBand} x2={m.smoothingBelow} fill="#5eead4" fillOpacity={0.25} label={{ value: "fine-aim smoothing", fontSize: 11, position: "insideTopLeft" }} />}
          {m.slowSpeed !== null && <ReferenceLine x={m.slowSpeed} stroke="#475569" strokeDasharray="4 3" label={{ value: "slow", fontSize: 11, position: "top" }} />}
          {m.fastSpeed !== null && <ReferenceLine x={m.fastSpeed} stroke="#475569" strokeDasharray="4 3" label={{ value: "fast", fontSize: 11, position: "top" }} />}
          <Legend verticalAlign="top" wrapperStyle={{ fontSize: 12 }} />
          {curves.map((c, i) => {
            const st = seriesStyle(i);
            return <Line key={c.label} dataKey={c.label} name={c.label} stroke={st.stroke} strokeDasharray={st.dash} dot={false} strokeWidth={2} isAnimationActive={false} />;
          })}
        </LineChart>
      </ResponsiveContainer>
    </Figure>
  );
}
