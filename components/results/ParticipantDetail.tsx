"use client";
import { useState } from "react";
import { CartesianGrid, Legend, ResponsiveContainer, Scatter, ScatterChart, XAxis, YAxis } from "recharts";
import useSWR from "swr";
import type { ParticipantView, ResultsParticipant } from "@/lib/results";
import { fmt } from "./chartStyle";
import { Figure } from "./Figure";
import { fetchJson } from "./ResultsTypes";

type Stream = { id: number; condition: string; conditionIndex: number; block: number; sequence: number; practice: boolean; sampleCount: number; movementCount: number };
type Response = { participant: ResultsParticipant; streams: Stream[]; view: ParticipantView };

/** One participant: sequences with data-quality flags, and the trajectory of a chosen sequence replayed from its raw stream. */
export function ParticipantDetail({ studyId, participantId }: { studyId: number; participantId: number }) {
  const [stream, setStream] = useState<number | null>(null);
  const url = `/api/studies/${studyId}/results/participants/${participantId}${stream ? `?stream=${stream}` : ""}`;
  const { data, error } = useSWR(url, (u: string) => fetchJson<Response>(u), { keepPreviousData: true });
  if (error) return <p className="notice" role="alert">{(error as Error).message}</p>;
  if (!data) return <p role="status">Loading…</p>;
  const { view, streams } = data;
  const t = view.trajectory;
  const unit = view.unit;
  return (
    <div className="space-y-4">
      <p className="text-sm">Status: {data.participant.status.replace("_", " ")}; counterbalancing row {data.participant.cbRow === null ? "not assigned" : data.participant.cbRow + 1}.</p>
      <section className="card space-y-2">
        <label htmlFor="stream-select">Sequence to replay</label>
        <select id="stream-select" className="input max-w-md" value={t?.streamId ?? ""} onChange={(e) => setStream(Number(e.target.value))}>
          {streams.map((s) => (
            <option key={s.id} value={s.id}>{s.condition}, block {s.block}, sequence {s.sequence}{s.practice ? " (practice)" : ""}</option>
          ))}
        </select>
      </section>
      {t ? (
        <Figure id="trajectory" title={`Trajectory: ${t.condition}, block ${t.block}, sequence ${t.sequence}${t.practice ? " (practice)" : ""}`}
          caption={`The cursor path (${unit}, y down as on the screen) replayed from the raw sensor stream through the condition's transfer function: ${t.samples} samples at ${fmt(t.sampleRateHz, 1)} Hz over ${fmt(t.durationMs / 1000, 1)} s, longest gap ${fmt(t.maxGapMs, 0)} ms. Open squares are target centres (W = ${fmt(t.width, 0)} ${unit}); filled dots are hits, crosses misses.`}>
          <ResponsiveContainer width="100%" height={420}>
            <ScatterChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid strokeDasharray="3 3" stroke="#e2e8f0" />
              <XAxis type="number" dataKey="x" domain={["auto", "auto"]} tick={{ fontSize: 11 }} label={{ value: `x (${unit})`, position: "insideBottom", offset: -14, fontSize: 12 }} />
              <YAxis type="number" dataKey="y" domain={["auto", "auto"]} reversed tick={{ fontSize: 11 }} label={{ value: `y (${unit})`, angle: -90, position: "insideLeft", fontSize: 12 }} />
              <Legend verticalAlign="top" wrapperStyle={{ fontSize: 12 }} />
              <Scatter name="path" data={t.points} line={{ stroke: "#334155", strokeWidth: 1 }} shape={() => <g />} isAnimationActive={false} />
              <Scatter name="targets" data={t.targets} shape="square" fill="#ffffff" stroke="#0f172a" isAnimationActive={false} />
              <Scatter name="hits" data={t.selections.filter((s) => s.hit)} shape="circle" fill="#0f172a" isAnimationActive={false} />
              <Scatter name="misses" data={t.selections.filter((s) => !s.hit)} shape="cross" fill="#b91c1c" isAnimationActive={false} />
            </ScatterChart>
          </ResponsiveContainer>
        </Figure>
      ) : (
        <p className="notice">No raw stream to replay for this participant.</p>
      )}
      <section className="card space-y-2 overflow-x-auto">
        <h2>Sequences and data quality</h2>
        <table data-testid="participant-sequences">
          <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">
            Per sequence: movements kept (n), misfires removed, error rate, effective width We ({unit}), IDe (bits), MT (ms), TP (bits/s). Flags: sensor rate below {view.thresholds.minSampleRateHz} Hz, gaps over {view.thresholds.maxGapMs} ms, refused samples, error rate over {Math.round(view.thresholds.maxErrorRate * 100)} %.
          </caption>
          <thead><tr><th>condition</th><th>block</th><th>seq.</th><th>A×W</th><th>n</th><th>misfires</th><th>errors (%)</th><th>We</th><th>IDe</th><th>MT</th><th>TP</th><th>rate (Hz)</th><th>flags</th></tr></thead>
          <tbody>
            {view.sequences.map((s) => (
              <tr key={`${s.condition}|${s.block}|${s.sequence}`}>
                <td>{s.condition}</td><td>{s.block}</td><td>{s.sequence}</td>
                <td>{s.summary ? `${s.summary.amplitude}×${s.summary.width}` : "–"}</td>
                <td>{s.summary?.n ?? "–"}</td><td>{s.summary?.excluded ?? "–"}</td>
                <td>{s.summary ? fmt(s.summary.errorRate * 100, 1) : "–"}</td>
                <td>{fmt(s.summary?.we, 1)}</td><td>{fmt(s.summary?.ide)}</td><td>{fmt(s.summary?.mt, 0)}</td><td>{fmt(s.summary?.tp)}</td>
                <td>{fmt(s.sampleRateHz, 1)}</td>
                <td>{s.flags.length === 0 ? "none" : <ul>{s.flags.map((f) => <li key={f.text}>{f.level === "warning" ? "Warning: " : "Note: "}{f.text}</li>)}</ul>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
