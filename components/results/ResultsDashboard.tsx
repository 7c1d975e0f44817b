"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import { fmt } from "./chartStyle";
import { EndpointChart } from "./EndpointChart";
import { ExportPanel } from "./ExportPanel";
import { Figure } from "./Figure";
import { FittsChart } from "./FittsChart";
import { LearningChart } from "./LearningChart";
import { PathTable } from "./PathTable";
import { ProgressTable } from "./ProgressTable";
import { fetchJson, type ResultsResponse } from "./ResultsTypes";
import { ExclusionControls, type ExclusionChoice } from "./ExclusionControls";
import { AnovaTable, BetweenGroupsTable, ConditionTable, GroupConditionTable, PosthocTable } from "./StatsTables";
import { IntervalBarChart } from "./ThroughputChart";
import type { ResultsView } from "@/lib/results";

/** Participants (with data or not) by the protocol version they ran, e.g. "version 1: 4 (P-…, P-…), version 2: 2 (…)". */
function versionCounts(participants: ResultsView["participants"]): string {
  const by = new Map<string, string[]>();
  for (const p of participants) {
    const k = p.protocolVersion ? `version ${p.protocolVersion}` : "no version recorded";
    by.set(k, [...(by.get(k) ?? []), p.code]);
  }
  return [...by.entries()].sort().map(([k, codes]) => `${k}: ${codes.length} (${codes.join(", ")})`).join("; ") || "none yet";
}

/** The results page: fetched on the client and refreshed every 15 s while data arrive. */
export function ResultsDashboard({ studyId, canExport = false }: { studyId: number; canExport?: boolean }) {
  const [choice, setChoice] = useState<ExclusionChoice>({ exclude: "misfire", drop: [] });
  const query = new URLSearchParams({ exclude: choice.exclude, drop: choice.drop.join(",") }).toString();
  const { data, error, isLoading } = useSWR(`/api/studies/${studyId}/results?${query}`, (u: string) => fetchJson<ResultsResponse>(u), { refreshInterval: 15_000, keepPreviousData: true });
  if (isLoading && !data) return <p role="status">Loading the results…</p>;
  if (error) return <p className="notice" role="alert">The results could not be loaded: {(error as Error).message}</p>;
  if (!data) return null;
  const view = data.results;
  const unit = view?.unit ?? "px";
  const a = view?.analysis ?? null;
  return (
    <div className="space-y-6">
      <p className="text-sm text-slate-700">Computed {new Date(data.computedAt).toLocaleTimeString()}; refreshes on its own while participants take part. <span className="print:hidden">Print this page for a paper copy.</span></p>
      {!data.hasDesign && <p className="notice">This study has no design yet.</p>}
      {view && (
        <section className="card space-y-2 overflow-x-auto" aria-labelledby="progress-title">
          <h2 id="progress-title">Progress</h2>
          <ProgressTable view={view} />
        </section>
      )}
      {view && <ExclusionControls value={choice} onChange={setChoice} busy={isLoading} />}
      {view?.analysisError && <p className="notice" role="alert">The analysis stopped: {view.analysisError}</p>}
      {view && !a && !view.analysisError && <p className="notice">No movements recorded yet.</p>}
      {view && a && (
        <>
          <section className="space-y-4" aria-labelledby="perf-title">
            <h2 id="perf-title">Performance by condition</h2>
            <div className="grid gap-4 lg:grid-cols-2">
              <Figure id="tp" title="Throughput" caption={`Mean throughput TP per condition (bits/s) over ${a.missing.participantsIncluded} participants' cell means (mean of means, ISO 9241-411); whiskers are 95 % t intervals. Labels give the means.`}>
                <IntervalBarChart analysis={a} measure="tp" />
              </Figure>
              <Figure id="errors" title="Error rates" caption="Mean share of selections outside the target per condition (%), misfires removed; whiskers are 95 % t intervals over participants.">
                <IntervalBarChart analysis={a} measure="errorRate" />
              </Figure>
              <Figure id="fitts" title="Movement time against effective difficulty" caption={`Mean movement time MT (ms) of each A×W pair against its effective index of difficulty IDe (bits), pooled over participants; each condition has its own marker shape and its fitted line MT = a + b·IDe in its own dash pattern.`}>
                <FittsChart view={view} />
              </Figure>
              <Figure id="learning" title="Learning across blocks" caption="Mean throughput (bits/s) per block and condition: participants' block means, then their mean. Lines differ by dash pattern and marker, not colour alone.">
                <LearningChart view={view} />
              </Figure>
            </div>
            <Figure id="endpoints" title="End points on the task axis" caption={`Selection points relative to the target centre, rotated so the movement runs left to right, in target widths W (unit of W: ${unit}). x > 0 is overshoot. The shaded band is ±We/2, the effective width (We = 4.133·SDx); filled dots are hits, crosses are misses; misfires are left out. At most 1500 points per condition are drawn.`}>
              <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">{view.endpoints.map((c) => <EndpointChart key={c.condition} cloud={c} />)}</div>
            </Figure>
            <div className="card overflow-x-auto"><ConditionTable analysis={a} /></div>
            {a.conditionsByGroup && <div className="card overflow-x-auto"><GroupConditionTable analysis={a} /></div>}
            <section className="card overflow-x-auto space-y-2" aria-labelledby="path-title">
              <h3 id="path-title" className="text-base font-semibold">Path accuracy</h3>
              <PathTable analysis={a} status={view.paths} unit={unit} />
            </section>
          </section>
          <section className="card space-y-4 overflow-x-auto" aria-labelledby="stats-title">
            <h2 id="stats-title">Statistics</h2>
            <AnovaTable rows={a.anova} caption={`ANOVA of TP over ${a.missing.participantsIncluded} participants × conditions${a.groups ? " with the between-subject factors" : ""}: within effects against their own effect × participants${a.groups ? "-within-groups" : ""} error, between effects against participants within groups; Greenhouse–Geisser and Huynh–Feldt (as R reports it) corrected p beside the uncorrected one; Mauchly's test of sphericity.`} />
            {a.anovaErrorRate && <AnovaTable rows={a.anovaErrorRate} caption="The same ANOVA on error rates (read with the Friedman test below: rates are not normal)." />}
            {a.friedman && <p className="text-sm">Friedman test on error rates: χ² = {fmt(a.friedman.statistic)}, df = {a.friedman.df}, p = {fmt(a.friedman.p, 3)}{a.friedman.note ? ` (${a.friedman.note})` : ""}.</p>}
            <PosthocTable rows={a.posthoc} caption="Paired t tests of TP between conditions over participants; p Holm-corrected over all pairs; d_z = mean difference / SD of differences. Differences in bits/s." />
            {a.posthocWithinGroups && <PosthocTable rows={a.posthocWithinGroups} caption="The same paired t tests within each group; p Holm-corrected over all rows of this table." />}
            {a.posthocBetweenGroups && <BetweenGroupsTable rows={a.posthocBetweenGroups} />}
          </section>
          <section className="card space-y-2" aria-labelledby="excl-title">
            <h2 id="excl-title">Exclusions</h2>
            <ul className="list-disc pl-5 text-sm" data-testid="exclusions">
              <li>Rule: {view.exclusions.rule}.</li>
              <li>{a.excluded} of {a.movements} movements removed: {a.exclusions.misfire} as misfires ({view.exclusions.short} too short, distance along the axis below A/2; {view.exclusions.far} too far, more than 2W from the target centre), {a.exclusions.mt3sd} as movement-time outliers, {a.exclusions.timed_out + a.exclusions.recentered + a.exclusions.clutched} for their flags ({a.exclusions.timed_out} timed out, {a.exclusions.recentered} recentered, {a.exclusions.clutched} clutched).</li>
              <li>{a.timeoutsKept} time-out(s) kept and counted as errors.</li>
              <li>{view.exclusions.sequencesDropped.length} sequence(s) left out of every summary{view.exclusions.sequencesDropped.length ? `: ${[...new Set(view.exclusions.sequencesDropped.map((d) => d.reason))].join("; ")}` : ""}.</li>
              <li>{view.exclusions.missing?.participantsExcluded ?? 0} participant(s) left out of every test for lacking a condition{view.exclusions.missing && view.exclusions.missing.participants.length > 0 ? `: ${view.exclusions.missing.participants.map((p) => `${p.participant} (${p.reason})`).join(", ")}` : ""}.</li>
              <li>{view.exclusions.withdrawn.length} withdrawn participant(s) left out entirely{view.exclusions.withdrawn.length ? `: ${view.exclusions.withdrawn.join(", ")}` : ""}.</li>
              <li data-testid="researcher-exclusions">{(view.exclusions.byResearcher ?? []).filter((e) => e.scope === "participant").length} participant(s) and {(view.exclusions.byResearcher ?? []).filter((e) => e.scope === "sequence").length} sequence(s) excluded by the team{(view.exclusions.byResearcher ?? []).length ? ": " : "."}
                {(view.exclusions.byResearcher ?? []).length > 0 && <ul className="list-[circle] pl-5">{view.exclusions.byResearcher.map((e, i) => <li key={i}>{e.participant}{e.scope === "sequence" ? `, ${e.condition}, block ${e.block}, sequence ${e.sequence}` : ""}: {e.reason} ({e.movements} movements)</li>)}</ul>}
              </li>
              <li data-testid="protocol-versions">By protocol version: {versionCounts(view.participants)}.</li>
              {(view.exclusions.pilotsIncluded ?? []).length > 0 && <li data-testid="pilots-included">{view.exclusions.pilotsIncluded.length} pilot or simulated participant(s) included by the team: {view.exclusions.pilotsIncluded.join(", ")}.</li>}
              {a.notes.map((n) => <li key={n}>{n}</li>)}
              <li>Values that cannot be computed: {a.rule}</li>
            </ul>
          </section>
        </>
      )}
      {view && (
        <section className="card space-y-2 overflow-x-auto" aria-labelledby="people-title">
          <h2 id="people-title">Participants</h2>
          <table>
            <thead><tr><th>code</th><th>status</th><th>row</th>{view.betweenFactors.map((f) => <th key={f.name}>{f.name}</th>)}<th>movements</th></tr></thead>
            <tbody>
              {view.participants.map((p) => (
                <tr key={p.id}><td><Link href={`/studies/${studyId}/participants/${p.id}`}>{p.code}</Link></td><td>{p.status.replace("_", " ")}</td><td>{p.cbRow === null ? "–" : p.cbRow + 1}</td>{view.betweenFactors.map((f) => <td key={f.name}>{p.betweenLevels[f.name] ?? "–"}</td>)}<td>{p.movements}</td></tr>
              ))}
            </tbody>
          </table>
        </section>
      )}
      <ExportPanel studyId={studyId} canExport={canExport} />
    </div>
  );
}
