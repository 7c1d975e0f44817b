"use client";

import { useMemo } from "react";
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { TransferConfig } from "@/lib/motion/config";
import { turnDisplacement } from "@/lib/study/curves";
import { Figure } from "@/components/results/Figure";

export const TURN_DEG = 30;
export const QUICK_MS = 250;
export const SLOW_MS = 2000;

/** View or cursor displacement for a 30° device turn at each condition's settings, quick and slow, side by side. */
export function TurnChart({ conditions }: { conditions: { label: string; config: TransferConfig }[] }) {
  const rows = useMemo(() => conditions.map((c) => {
    const quick = turnDisplacement(c.config, TURN_DEG, QUICK_MS);
    const slow = turnDisplacement(c.config, TURN_DEG, SLOW_MS);
    return { label: c.label, quick: quick ? Math.round(quick.displacement * 10) / 10 : null, slow: slow ? Math.round(slow.displacement * 10) / 10 : null, unit: quick?.unit ?? null };
  }), [conditions]);
  const shown = rows.filter((r) => r.quick !== null);
  if (shown.length === 0) return null;
  const unit = shown[0]!.unit!;
  return (
    <Figure id="turn" title={`What a ${TURN_DEG}° device turn does`} caption={
      <>
        {unit === "px" ? "Cursor" : "View"} displacement ({unit}) for a {TURN_DEG}° turn of the device about the vertical, done quickly ({QUICK_MS} ms) or slowly ({SLOW_MS / 1000} s), run through the engine at each condition&apos;s settings. With a constant gain both bars equal gain × {TURN_DEG}°{unit === "px" ? " × pixels per degree" : ""}; a speed-dependent curve or a dead band makes the slow turn shorter.
        {rows.length > shown.length ? ` Conditions without motion input (${rows.filter((r) => r.quick === null).map((r) => r.label).join(", ")}) are not shown.` : ""}
        <span className="sr-only" data-testid="turn-readout"> {shown.map((r) => `${r.label}: ${r.quick} ${unit} quick, ${r.slow} ${unit} slow`).join("; ")}.</span>
      </>
    }>
      <ResponsiveContainer width="100%" height={Math.max(220, 40 + 36 * shown.length)}>
        <BarChart data={shown} layout="vertical" margin={{ top: 12, right: 24, bottom: 28, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" />
          <XAxis type="number" tick={{ fontSize: 12 }} label={{ value: `displacement (${unit})`, position: "insideBottom", offset: -16, fontSize: 12 }} />
          <YAxis type="category" dataKey="label" width={150} tick={{ fontSize: 11 }} />
          <Legend verticalAlign="top" wrapperStyle={{ fontSize: 12 }} />
          <Bar dataKey="quick" name={`quick (${QUICK_MS} ms)`} fill="#1e293b" isAnimationActive={false} />
          <Bar dataKey="slow" name={`slow (${SLOW_MS / 1000} s)`} fill="#ffffff" stroke="#0f766e" isAnimationActive={false} />
        </BarChart>
      </ResponsiveContainer>
    </Figure>
  );
}
