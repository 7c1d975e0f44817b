"use client";

import { memo, useMemo } from "react";
import { conditionConfig, conditionsOf, studyDesignSchema, type StudyDesignInput } from "@/lib/study/design";
import { GainCurveChart } from "../charts/GainCurveChart";
import { RateResponseChart } from "../charts/RateResponseChart";
import { TurnChart } from "../charts/TurnChart";
import { FitTimeChecks } from "./FitTimeChecks";
import { PowerPanel } from "./PowerPanel";
import { TryPanel } from "./TryPanel";
import { designSummary, orderPreview } from "@/lib/study/summary";

/**
 * What the design implies, recomputed from the (deferred) form values: the summary, the order of
 * conditions per participant, and, when the design is valid, the pictures and checks.
 */
export const DesignOverview = memo(function DesignOverview({ values, studyId }: { values: StudyDesignInput; studyId: number }) {
  const parsed = useMemo(() => studyDesignSchema.safeParse(values), [values]);
  const computed = useMemo(() => {
    if (!parsed.success) return null;
    try {
      const d = parsed.data;
      const configs = conditionsOf(d).map((c) => ({ label: c.label, config: { ...conditionConfig(d, c), displayMode: d.task.displayMode } }));
      return { summary: designSummary(d), preview: orderPreview(d), configs, error: null };
    } catch (e) {
      return { summary: null, preview: null, configs: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [parsed]);
  const summary = computed?.summary ?? null;
  const preview = computed?.preview ?? null;
  const configs = computed?.configs ?? null;
  return (
    <section className="space-y-3" aria-label="Design summary">
      <h2>Summary</h2>
      {!parsed.success && <p className="text-sm">The summary appears when the design is valid ({parsed.error.issues[0]?.path.join(".")}: {parsed.error.issues[0]?.message}).</p>}
      {computed?.error && <p className="field-error" role="alert">{computed.error}</p>}
      {summary && (
        <div className="card space-y-2 text-sm">
          <p><strong>{summary.conditions.length}</strong> conditions · <strong>{summary.trialsPerParticipant}</strong> trials per participant (+{summary.practiceTrialsPerParticipant} practice) · {summary.totalTrials} trials for N = {values.plannedParticipants}.</p>
          <table><thead><tr><th>#</th><th>Condition</th><th>IDs (bits) of its A×W</th></tr></thead>
            <tbody>{summary.conditions.map((c) => <tr key={c.index}><td>{c.index + 1}</td><td>{c.label}</td><td>{summary.difficulties.map((d) => `A${d.amplitude}/W${d.width}: ${d.id.toFixed(2)}`).join(" · ")}</td></tr>)}</tbody>
          </table>
        </div>
      )}
      {configs && parsed.success && (
        <>
          <h3 className="font-semibold">What each condition&apos;s settings do</h3>
          <div className="grid gap-3 xl:grid-cols-2">
            <GainCurveChart conditions={configs} />
            <TurnChart conditions={configs} />
            <RateResponseChart conditions={configs} />
          </div>
          <TryPanel studyId={studyId} design={parsed.data} conditions={configs} />
          <FitTimeChecks design={parsed.data} />
          <PowerPanel design={parsed.data} studyId={studyId} />
        </>
      )}
      {preview && (
        <div className="space-y-2">
          <h3 className="font-semibold">Condition order per participant ({preview.rows} rows)</h3>
          {preview.warning && <p className="notice" role="alert">Warning: {preview.warning}</p>}
          <div className="card max-h-80 overflow-auto p-0">
            <table aria-label="Order preview"><thead><tr><th>Participant</th><th>Row</th>{preview.participants[0]?.order.map((_, i) => <th key={i}>{i + 1}.</th>)}</tr></thead>
              <tbody>{preview.participants.map((p) => <tr key={p.participant}><td>{p.participant}</td><td>{p.row + 1}</td>{p.order.map((c, i) => <td key={i}>{c}</td>)}</tr>)}</tbody>
            </table>
          </div>
        </div>
      )}
    </section>
  );
});
