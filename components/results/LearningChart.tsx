"use client";
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { ResultsView } from "@/lib/results";
import { seriesStyle } from "./chartStyle";

/** TP (bits/s) by block, one line per condition (mean of participants' block means). */
export function LearningChart({ view }: { view: ResultsView }) {
  const conditions = view.analysis!.conditions.map((c) => c.condition);
  const blocks = [...new Set(view.learningCurve.map((p) => p.block))].sort((a, b) => a - b);
  const data = blocks.map((b) => ({ block: `block ${b}`, ...Object.fromEntries(view.learningCurve.filter((p) => p.block === b).map((p) => [p.condition, p.tp])) }));
  return (
    <ResponsiveContainer width="100%" height={260}>
      <LineChart data={data} margin={{ top: 12, right: 16, bottom: 8, left: 8 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" />
        <XAxis dataKey="block" tick={{ fontSize: 12 }} />
        <YAxis tick={{ fontSize: 12 }} domain={["auto", "auto"]} label={{ value: "TP (bits/s)", angle: -90, position: "insideLeft", fontSize: 12 }} />
        <Legend verticalAlign="top" wrapperStyle={{ fontSize: 12 }} />
        {conditions.map((c, i) => {
          const st = seriesStyle(i);
          return <Line key={c} dataKey={c} name={c} stroke={st.stroke} strokeDasharray={st.dash} strokeWidth={1.8} dot={{ r: 4, fill: st.fill, stroke: st.stroke }} isAnimationActive={false} />;
        })}
      </LineChart>
    </ResponsiveContainer>
  );
}
