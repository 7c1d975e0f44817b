"use client";
import { CartesianGrid, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, XAxis, YAxis } from "recharts";
import type { EndpointCloud } from "@/lib/results";
import { fmt } from "./chartStyle";

/** One condition's end points in target widths on the task axis, with the ±We/2 band shaded. */
export function EndpointChart({ cloud }: { cloud: EndpointCloud }) {
  const half = cloud.weOverW !== null ? cloud.weOverW / 2 : 0.5;
  const hits = cloud.points.filter((p) => p.hit);
  const misses = cloud.points.filter((p) => !p.hit);
  return (
    <div>
      <p className="text-sm font-semibold">{cloud.condition} <span className="font-normal text-slate-700">(We/W = {fmt(cloud.weOverW)}, {cloud.movements} movements)</span></p>
      <ResponsiveContainer width="100%" height={220}>
        <ScatterChart margin={{ top: 8, right: 8, bottom: 24, left: 0 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#e2e8f0" />
          <ReferenceArea x1={-half} x2={half} fill="#94a3b8" fillOpacity={0.25} stroke="#475569" strokeDasharray="4 2" ifOverflow="extendDomain" />
          <ReferenceLine x={0} stroke="#0f172a" />
          <XAxis type="number" dataKey="x" domain={[-2, 2]} allowDataOverflow tick={{ fontSize: 11 }} label={{ value: "along the axis (W)", position: "insideBottom", offset: -14, fontSize: 11 }} />
          <YAxis type="number" dataKey="y" domain={[-2, 2]} allowDataOverflow tick={{ fontSize: 11 }} width={32} />
          <Scatter name="hit" data={hits} shape="circle" fill="#1e293b" fillOpacity={0.5} isAnimationActive={false} />
          <Scatter name="miss" data={misses} shape="cross" fill="#b91c1c" isAnimationActive={false} />
        </ScatterChart>
      </ResponsiveContainer>
    </div>
  );
}
