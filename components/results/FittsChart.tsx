"use client";
import { CartesianGrid, Legend, ResponsiveContainer, Scatter, ScatterChart, XAxis, YAxis } from "recharts";
import type { ResultsView } from "@/lib/results";
import { seriesStyle } from "./chartStyle";

/** MT (ms) against IDe (bits): each condition's A×W means and its fitted line MT = a + b·IDe. */
export function FittsChart({ view }: { view: ResultsView }) {
  const analysis = view.analysis!;
  const conditions = analysis.conditions.map((c) => c.condition);
  const ides = view.awMeans.map((p) => p.ide);
  const lo = Math.min(...ides), hi = Math.max(...ides);
  return (
    <ResponsiveContainer width="100%" height={320}>
      <ScatterChart margin={{ top: 12, right: 16, bottom: 28, left: 8 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" />
        <XAxis type="number" dataKey="x" name="IDe" domain={["auto", "auto"]} tick={{ fontSize: 12 }} label={{ value: "IDe (bits)", position: "insideBottom", offset: -16, fontSize: 12 }} />
        <YAxis type="number" dataKey="y" name="MT" domain={["auto", "auto"]} tick={{ fontSize: 12 }} label={{ value: "MT (ms)", angle: -90, position: "insideLeft", fontSize: 12 }} />
        <Legend verticalAlign="top" wrapperStyle={{ fontSize: 12 }} />
        {conditions.map((c, i) => {
          const st = seriesStyle(i);
          const fit = analysis.regression.find((r) => r.condition === c);
          const pts = view.awMeans.filter((p) => p.condition === c).map((p) => ({ x: p.ide, y: p.mt }));
          const line = fit && fit.slope !== null && fit.intercept !== null ? [{ x: lo, y: fit.intercept + fit.slope * lo }, { x: hi, y: fit.intercept + fit.slope * hi }] : [];
          return [
            <Scatter key={`p-${c}`} name={c} data={pts} shape={st.shape} fill={st.fill} stroke={st.stroke} isAnimationActive={false} />,
            <Scatter key={`l-${c}`} name={`${c} fit`} legendType="none" data={line} line={{ stroke: st.stroke, strokeDasharray: st.dash, strokeWidth: 1.5 }} shape={() => <g />} isAnimationActive={false} />,
          ];
        })}
      </ScatterChart>
    </ResponsiveContainer>
  );
}
