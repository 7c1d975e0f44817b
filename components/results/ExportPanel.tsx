"use client";
import { useState } from "react";
import useSWR from "swr";
import type { ExportJob } from "@/lib/data/exports";
import { fetchJson } from "./ResultsTypes";

const sizeText = (n: number | null): string => (n === null ? "–" : n < 1024 * 1024 ? `${(n / 1024).toFixed(1)} KiB` : `${(n / 1024 / 1024).toFixed(1)} MiB`);

/**
 * Start an anonymised archive (editors and owners; viewers see the list), watch its progress,
 * list earlier ones with SHA-256, size and the day the file is deleted.
 */
export function ExportPanel({ studyId, canExport }: { studyId: number; canExport: boolean }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [options, setOptions] = useState({ pseudonyms: "random" as "random" | "stable", includeStreams: false, includeDates: false, includeFreeText: false });
  const { data, mutate } = useSWR(`/api/studies/${studyId}/exports`, (u: string) => fetchJson<{ exports: ExportJob[] }>(u), {
    refreshInterval: (latest) => (latest?.exports.some((e) => e.status === "queued" || e.status === "running") ? 700 : 0),
  });
  const jobs = data?.exports ?? [];

  async function start() {
    setBusy(true);
    setError(null);
    try {
      const res = await fetch(`/api/studies/${studyId}/exports`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(options) });
      if (!res.ok) setError(((await res.json()) as { error: { message: string } }).error.message);
      await mutate();
    } finally {
      setBusy(false);
    }
  }

  const check = (key: "includeStreams" | "includeDates" | "includeFreeText", label: string, hint: string) => (
    <label className="flex items-start gap-2 font-normal">
      <input type="checkbox" className="mt-1" checked={options[key]} onChange={(e) => setOptions({ ...options, [key]: e.target.checked })} />
      <span>{label} <span className="text-slate-600">— {hint}</span></span>
    </label>
  );

  return (
    <section className="card space-y-3" aria-labelledby="export-title">
      <h2 id="export-title">Anonymised archive</h2>
      <p className="max-w-prose text-sm">
        A ZIP with the movements, sequences, cells, conditions, participants and questionnaires as CSV, a data package description, a codebook,
        a generated methods section and the consent documents&apos; text. No e-mail, name, session link, IP address or participant code leaves in it.
      </p>
      {canExport ? <>
      <fieldset className="space-y-1">
        <legend className="text-sm font-semibold">Pseudonyms</legend>
        <label className="flex items-center gap-2 font-normal"><input type="radio" name="pseudonyms" checked={options.pseudonyms === "random"} onChange={() => setOptions({ ...options, pseudonyms: "random" })} /> new random pseudonyms for this archive</label>
        <label className="flex items-center gap-2 font-normal"><input type="radio" name="pseudonyms" checked={options.pseudonyms === "stable"} onChange={() => setOptions({ ...options, pseudonyms: "stable" })} /> stable pseudonyms (the same in every archive of this study, from a keyed hash)</label>
      </fieldset>
      <fieldset className="space-y-1">
        <legend className="text-sm font-semibold">Include</legend>
        {check("includeStreams", "raw sensor streams", "one compressed file per sequence; larger")}
        {check("includeDates", "calendar dates", "otherwise times are relative to each session's start")}
        {check("includeFreeText", "free-text answers", "read them first: they may name people or places")}
      </fieldset>
      <button type="button" className="btn" onClick={start} disabled={busy}>Start export</button>
      <p className="text-sm text-slate-700">Exports wait their turn on the server (one at a time per study). Archive files are deleted when their retention period ends; the list below keeps their SHA-256.</p>
      {error && <p className="field-error" role="alert">{error}</p>}
      </> : <p className="text-sm">The study&apos;s editors and owners start exports; as a viewer you can see and download the archives below.</p>}
      {jobs.length > 0 && (
        <div className="overflow-x-auto">
        <table>
          <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">Archives of this study, newest first. Check a download with its SHA-256.</caption>
          <thead><tr><th>started</th><th>by</th><th>status</th><th>size</th><th>SHA-256</th><th>k</th><th></th></tr></thead>
          <tbody>
            {jobs.map((j) => (
              <tr key={j.id} data-testid={`export-${j.id}`}>
                <td>{new Date(j.createdAt).toLocaleString()}</td>
                <td>{j.createdBy}</td>
                <td>
                  {j.status === "running" || j.status === "queued" ? (
                    <span className="flex items-center gap-2">
                      <progress max={1} value={j.progress} aria-label={`export ${j.id} progress`} />
                      <span>{j.status === "queued" ? "waiting for its turn" : `${Math.round(j.progress * 100)} % (${j.stage})`}</span>
                    </span>
                  ) : j.status !== "done" ? <span className="text-red-800">failed: {j.error}</span>
                    : j.supersededAt ? <span>superseded on {new Date(j.supersededAt).toLocaleDateString()}: {j.supersededReason ?? "withdrawn"}; its file is deleted</span>
                    : j.fileDeletedAt ? <span>file deleted on {new Date(j.fileDeletedAt).toLocaleDateString()} (retention period over)</span>
                    : <span className="flex flex-col"><span>done</span>{j.deleteAfter && <span className="text-xs text-slate-700">file deleted on {new Date(j.deleteAfter).toLocaleDateString()} (retention period)</span>}</span>}
                </td>
                <td>{sizeText(j.sizeBytes)}</td>
                <td><code className="break-all text-xs">{j.sha256 ?? "–"}</code></td>
                <td>{j.kAnonymity ?? "–"}</td>
                <td>{j.status === "done" && j.fileName && <a href={`/api/exports/${j.id}/download`} download>Download</a>}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
      )}
      {jobs[0]?.warnings.map((w) => <p key={w} className="notice" role="status">Warning: {w}</p>)}
    </section>
  );
}
