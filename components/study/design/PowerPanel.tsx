"use client";

import { useMemo, useState } from "react";
import { Area, CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { StudyDesign } from "@/lib/study/design";
import { counterbalancingRows, betweenGroupCount } from "@/lib/study/counterbalance";
import { pilotEstimates, powerCurveNs } from "@/lib/study/power";
import { Figure } from "@/components/results/Figure";
import type { ChecksAnswer } from "./checksProtocol";
import { progressText, useChecksWorker } from "./useChecksWorker";

const STUDIES = 400;
const PEOPLE = 8;

type ResultsAnswer = { results: { analysis: { cells: { participant: string; condition: string; tp: number }[] } | null; conditions: { label: string; factors: Record<string, string> }[] } | null };

/** "How many participants": a seeded Monte Carlo power curve of the study's main comparison, in a Web Worker. */
export function PowerPanel({ design, studyId }: { design: StudyDesign; studyId: number }) {
  const factors = design.factors.filter((f) => f.levels.length >= 2);
  const [factor, setFactor] = useState(factors[0]?.name ?? "");
  const [delta, setDelta] = useState("0.5");
  const [spread, setSpread] = useState("0.5");
  const [seed, setSeed] = useState("1");
  const [pilotNote, setPilotNote] = useState<string | null>(null);
  const worker = useChecksWorker<Extract<ChecksAnswer, { kind: "power" }>>();
  const step = useMemo(() => { try { return counterbalancingRows(design).length * betweenGroupCount(design); } catch { return 1; } }, [design]);
  const nValues = useMemo(() => powerCurveNs(step), [step]);
  if (factors.length === 0) return <p className="text-sm">The power curve needs a within-subject factor with at least two levels.</p>;
  const chosen = factors.find((f) => f.name === factor) ?? factors[0]!;
  const d = Number(delta), s = Number(spread), sd = Number(seed);
  const valid = d > 0 && s >= 0 && Number.isInteger(sd) && sd >= 0;
  const res = worker.answer?.kind === "power" ? worker.answer : null;
  const first80 = res?.points.find((p) => p.lo >= 0.8);

  const fromPilot = async () => {
    setPilotNote(null);
    try {
      const r = (await (await fetch(`/api/studies/${studyId}/results`)).json()) as ResultsAnswer;
      const cells = r.results?.analysis?.cells ?? [];
      const levelOf = Object.fromEntries((r.results?.conditions ?? []).map((c) => [c.label, c.factors[chosen.name] ?? ""]));
      const e = pilotEstimates(cells, levelOf, chosen.levels[0]!.label, chosen.levels.at(-1)!.label);
      setDelta(Math.abs(e.difference).toFixed(2));
      setSpread(e.spread.toFixed(2));
      setPilotNote(`From ${e.people} people of this study's data so far: difference ${e.difference.toFixed(2)}, spread ${e.spread.toFixed(2)} bits/s (the spread includes their measurement noise, so the curve errs on the safe side).`);
    } catch (err) {
      setPilotNote(`No pilot estimate: ${err instanceof Error ? err.message : String(err)}. Run a pilot first, or state both values.`);
    }
  };

  return (
    <section className="card space-y-3 text-sm" aria-labelledby="power-title">
      <h3 id="power-title" className="text-base font-semibold">How many participants</h3>
      <p>State the smallest throughput difference worth detecting between the first and last level of the main comparison, and how much that difference varies from person to person; the curve shows the share of simulated studies that detect it at each N.</p>
      <div className="grid gap-3 sm:grid-cols-4">
        <div><label htmlFor="power-factor">Main comparison</label>
          <select id="power-factor" className="input" value={chosen.name} onChange={(e) => setFactor(e.target.value)}>{factors.map((f) => <option key={f.name} value={f.name}>{f.name} ({f.levels[0]!.label} vs {f.levels.at(-1)!.label})</option>)}</select></div>
        <div><label htmlFor="power-delta">Smallest difference worth detecting (bits/s)</label><input id="power-delta" className="input" inputMode="decimal" value={delta} onChange={(e) => setDelta(e.target.value)} /></div>
        <div><label htmlFor="power-spread">Spread between people (SD of their difference, bits/s)</label><input id="power-spread" className="input" inputMode="decimal" value={spread} onChange={(e) => setSpread(e.target.value)} /></div>
        <div><label htmlFor="power-seed">Seed</label><input id="power-seed" className="input" inputMode="numeric" value={seed} onChange={(e) => setSeed(e.target.value)} /></div>
      </div>
      <p className="text-xs text-slate-600">For scale: throughputs of 1.2–4.9 bits/s are typical across techniques (science.md §1: stick 1.48, mouse 3.7–4.9 bits/s).</p>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn" disabled={!valid || worker.progress !== null}
          onClick={() => worker.run({ kind: "power", design, request: { factor: chosen.name, smallestDifference: d, spreadBetweenPeople: s, alpha: 0.05 }, people: PEOPLE, studies: STUDIES, seed: sd, nValues })}>Compute the power curve</button>
        {worker.progress && <button type="button" className="btn-secondary" onClick={worker.cancel}>Stop</button>}
        <button type="button" className="btn-secondary" onClick={() => void fromPilot()}>Take both from this study&apos;s pilot data</button>
      </div>
      {pilotNote && <p className="text-xs" role="status">{pilotNote}</p>}
      {worker.progress && <p role="status" className="text-xs">{progressText(worker.progress)} <progress className="align-middle" max={worker.progress.total} value={worker.progress.done} aria-label="Power curve progress" /></p>}
      {worker.answer?.kind === "error" && <p className="field-error" role="alert">{worker.answer.message}</p>}
      {res && (
        <Figure id="power" title="Share of simulated studies that detect the difference" caption={
          <>
            Each point: {STUDIES} simulated studies of N participants (N in steps of {step}, so every counterbalancing row{step > 1 ? " and group" : ""} is filled), each analysed with the project&apos;s repeated-measures ANOVA (Greenhouse–Geisser for more than two levels) and Holm-corrected post hoc tests at α = .05; shaded, the 95 % Monte Carlo interval (Clopper–Pearson). The first and last levels differ by {d} bits/s, levels between lie half-way, other factors have no effect; each cell adds the measurement noise of {PEOPLE} simulated participants at that condition&apos;s settings (SD {res.noise.map((n) => `${n.label} ${n.sdTp.toFixed(2)}${n.method === "stand-in" ? "*" : ""}`).join(", ")} bits/s{res.noise.some((n) => n.method === "stand-in") ? "; * a stand-in at default motion settings, since the simulated participant does not move this technique yet" : ""}). Seed {sd}.{" "}
            <span data-testid="power-readout">{first80 ? `N = ${first80.n} reaches 80 % with its whole interval (${Math.round(first80.share * 100)} %).` : `No N up to ${nValues.at(-1)} reaches 80 % for certain.`}</span>
          </>
        }>
          <ResponsiveContainer width="100%" height={280}>
            <ComposedChart data={res.points.map((p) => ({ n: p.n, share: p.share, band: [p.lo, p.hi] }))} margin={{ top: 12, right: 16, bottom: 28, left: 8 }}>
              <CartesianGrid strokeDasharray="3 3" stroke="#cbd5e1" />
              <XAxis type="number" dataKey="n" domain={["dataMin", "dataMax"]} tick={{ fontSize: 12 }} label={{ value: "participants (N)", position: "insideBottom", offset: -16, fontSize: 12 }} />
              <YAxis type="number" domain={[0, 1]} tick={{ fontSize: 12 }} label={{ value: "share detecting", angle: -90, position: "insideLeft", fontSize: 12 }} />
              <Area dataKey="band" stroke="none" fill="#5eead4" fillOpacity={0.35} isAnimationActive={false} />
              <Line dataKey="share" stroke="#1e293b" dot={{ r: 3 }} isAnimationActive={false} />
              <ReferenceLine y={0.8} stroke="#92400e" strokeDasharray="4 3" label={{ value: "80 %", fontSize: 11, position: "right" }} />
              <ReferenceLine x={design.plannedParticipants} stroke="#475569" label={{ value: "planned", fontSize: 11, position: "top" }} />
            </ComposedChart>
          </ResponsiveContainer>
          <table aria-label="Power per N" className="mt-2 text-xs"><thead><tr><th>N</th>{res.points.map((p) => <th key={p.n}>{p.n}</th>)}</tr></thead>
            <tbody><tr><td>share</td>{res.points.map((p) => <td key={p.n}>{Math.round(p.share * 100)} %</td>)}</tr></tbody></table>
        </Figure>
      )}
    </section>
  );
}
