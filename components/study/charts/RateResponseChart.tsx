"use client";

import { useMemo, type ReactNode } from "react";
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { TransferConfig } from "@/lib/motion/config";
import { stickResponsePoints, tiltResponsePoints, type RateResponse } from "@/lib/study/curves";
import { seriesStyle } from "@/components/results/chartStyle";
import { Figure } from "@/components/results/Figure";

/** One rate-response figure: each condition's rate against deflection or tilt, the first one's dead zone shaded. */
function ResponseFigure({ id, title, caption, xLabel, series, shadeOuter }: { id: string; title: string; caption: ReactNode; xLabel: string; series: { label: string; r: RateResponse }[]; shadeOuter: boolean }) {
  const first = series[0]!.r;
  const data = first.points.map((p, i) => Object.fromEntries([["x", p.x], ...series.map((s) => [s.label, s.r.points[i]!.rate])]));
  return (
    <Figure id={id} title={title} caption={caption}>
      <ResponsiveContainer width="100%" height={260}>
        <LineChart data={data} margin={{ top: 12, right: 16, bottom: 28, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" />
          <XAxis type="number" dataKey="x" domain={[0, first.points.at(-1)!.x]} tick={{ fontSize: 12 }} label={{ value: xLabel, position: "insideBottom", offset: -16, fontSize: 12 }} />
          <YAxis type="number" tick={{ fontSize: 12 }} label={{ value: "rate (view °/s)", angle: -90, position: "insideLeft", fontSize: 12 }} />
          <ReferenceArea x1={0} x2={first.deadZone} fill="#94a3b8" fillOpacity={0.35} label={{ value: "dead zone", fontSize: 11, position: "insideTop" }} />
          {shadeOuter && <ReferenceArea x1={first.outerEdge} x2={first.points.at(-1)!.x} fill="#5eead4" fillOpacity={0.25} />}
          <Legend verticalAlign="top" wrapperStyle={{ fontSize: 12 }} />
          {series.map((s, i) => <Line key={s.label} dataKey={s.label} stroke={seriesStyle(i).stroke} strokeDasharray={seriesStyle(i).dash} dot={false} strokeWidth={2} isAnimationActive={false} />)}
        </LineChart>
      </ResponsiveContainer>
    </Figure>
  );
}

/** Turning rate from centre to rim for rate sticks (and from level to full tilt for tilt-rate). */
export function RateResponseChart({ conditions }: { conditions: { label: string; config: TransferConfig }[] }) {
  const stick = useMemo(() => conditions.filter((c) => (c.config.technique === "stick" || c.config.technique === "motion+stick") && c.config.stickMode === "rate").map((c) => ({ label: c.label, r: stickResponsePoints(c.config, 100) })), [conditions]);
  const tilt = useMemo(() => conditions.filter((c) => c.config.technique === "tilt-rate").map((c) => ({ label: c.label, r: tiltResponsePoints(c.config, 100) })), [conditions]);
  const heading = conditions.filter((c) => (c.config.technique === "stick" || c.config.technique === "motion+stick") && c.config.stickMode !== "rate");
  return (
    <>
      {stick.length > 0 && (
        <ResponseFigure id="stick-response" title="Stick response from centre to rim" xLabel="stick deflection (0–1)" series={stick} shadeOuter
          caption={<>Turning rate (view °/s) against the stick&apos;s deflection (0 = centre, 1 = rim), from the engine&apos;s own stick stage. Shaded: the first condition&apos;s dead zone, and from its outer edge on, the top rate.</>} />
      )}
      {tilt.length > 0 && (
        <ResponseFigure id="tilt-response" title="Tilt-rate response" xLabel="tilt (°)" series={tilt} shadeOuter={false}
          caption={<>Turning rate (view °/s) against the tilt from the starting hold (°), from the same stage. Shaded: the first condition&apos;s tilt dead zone.</>} />
      )}
      {heading.length > 0 && (
        <p className="text-sm text-slate-700">Heading stick ({heading.map((h) => h.label).join(", ")}): pushed past {Math.round(heading[0]!.config.headingRimThreshold * 100)} % of the way to the rim, the stick turns the view to its own direction within {heading[0]!.config.headingTurnTimeMs} ms; it has no rate curve to draw.</p>
      )}
    </>
  );
}
