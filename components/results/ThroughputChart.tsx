"use client";
import { Bar, BarChart, CartesianGrid, ErrorBar, LabelList, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { ResultsView } from "@/lib/results";

type Measure = "tp" | "errorRate";

/** Bars of a per-condition mean with its 95 % t interval as whiskers (TP in bits/s or error rate in %). */
export function IntervalBarChart({ analysis, measure }: { analysis: NonNullable<ResultsView["analysis"]>; measure: Measure }) {
  const scale = measure === "errorRate" ? 100 : 1;
  // A mean that cannot be computed draws no bar; an interval that cannot be computed no whiskers (null).
  const data = analysis.conditions.map((c) => {
    const s = c[measure];
    const mean = s.mean === null ? null : s.mean * scale;
    const ci = mean !== null && s.ci95[0] !== null && s.ci95[1] !== null ? [mean - s.ci95[0] * scale, s.ci95[1] * scale - mean] : [0, 0];
    return { condition: c.condition, mean, ci, label: mean === null ? "–" : mean.toFixed(measure === "tp" ? 2 : 1) };
  });
  return (
    <ResponsiveContainer width="100%" height={260}>
      <BarChart data={data} margin={{ top: 20, right: 16, bottom: 24, left: 8 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" vertical={false} />
        <XAxis dataKey="condition" tick={{ fontSize: 12, fill: "#0f172a" }} interval={0} />
        <YAxis tick={{ fontSize: 12, fill: "#0f172a" }} label={{ value: measure === "tp" ? "TP (bits/s)" : "error rate (%)", angle: -90, position: "insideLeft", fontSize: 12 }} />
        <Bar dataKey="mean" fill="#cbd5e1" stroke="#1e293b" isAnimationActive={false}>
          <ErrorBar dataKey="ci" width={8} stroke="#0f172a" strokeWidth={1.5} />
          <LabelList dataKey="label" position="insideBottom" fontSize={11} fill="#0f172a" />
        </Bar>
      </BarChart>
    </ResponsiveContainer>
  );
}
