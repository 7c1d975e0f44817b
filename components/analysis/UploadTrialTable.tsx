"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

type Problem = { message: string };

/** Uploads a trial table with a progress bar (XMLHttpRequest reports upload progress; fetch does not). */
export function UploadTrialTable() {
  const router = useRouter();
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<Problem | null>(null);

  function submit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setProblem(null);
    const form = new FormData(event.currentTarget);
    const file = form.get("file");
    if (!(file instanceof File) || file.size === 0) return setProblem({ message: "Choose a CSV file first." });
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/analyses");
    xhr.upload.onprogress = (e) => e.lengthComputable && setProgress(e.loaded / e.total);
    xhr.onload = () => {
      setProgress(null);
      const body = JSON.parse(xhr.responseText || "{}") as { id?: number; error?: { message: string } };
      if (xhr.status === 201 && body.id) router.push(`/analyses/${body.id}`);
      else setProblem({ message: body.error?.message ?? `The upload failed (${xhr.status}).` });
    };
    xhr.onerror = () => {
      setProgress(null);
      setProblem({ message: "The network failed during the upload. Try again." });
    };
    setProgress(0);
    xhr.send(form);
  }

  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5 lg:items-end">
      <div className="space-y-1 lg:col-span-2">
        <label htmlFor="file">Trial table (CSV, up to 100 MB)</label>
        <input id="file" name="file" type="file" accept=".csv,text/csv" className="input" />
      </div>
      <div className="space-y-1">
        <label htmlFor="start">Start point S</label>
        <select id="start" name="start" className="input" defaultValue="actual">
          <option value="actual">previous selection (actual)</option>
          <option value="nominal">previous target centre (nominal)</option>
        </select>
      </div>
      <div className="space-y-1">
        <label htmlFor="exclude">Exclusion</label>
        <select id="exclude" name="exclude" className="input" defaultValue="misfire">
          <option value="misfire">misfires (&lt; A/2 or &gt; 2W off)</option>
          <option value="mt3sd">movement times beyond mean ± 3 SD</option>
          <option value="misfire+mt3sd">misfires, then times beyond ± 3 SD</option>
          <option value="none">none</option>
        </select>
      </div>
      <div className="space-y-1">
        <label htmlFor="unit">Unit</label>
        <select id="unit" name="unit" className="input" defaultValue="px">
          <option value="px">px</option><option value="mm">mm</option><option value="deg">deg</option>
        </select>
      </div>
      <div className="space-y-1 lg:col-span-2">
        <label htmlFor="geometry">Coordinates</label>
        <select id="geometry" name="geometry" className="input" defaultValue="plane">
          <option value="plane">points on the screen (px, mm or visual degrees)</option>
          <option value="sphere">view directions, yaw and pitch (deg, view mode)</option>
        </select>
      </div>
      <fieldset className="space-y-1 lg:col-span-3">
        <legend>Remove flagged movements (time-outs otherwise count as errors)</legend>
        <div className="flex flex-wrap gap-4 text-sm">
          <label><input type="checkbox" name="drop_timed_out" value="1" /> timed out</label>
          <label><input type="checkbox" name="drop_recentered" value="1" /> recentered</label>
          <label><input type="checkbox" name="drop_clutched" value="1" /> clutched</label>
        </div>
      </fieldset>
      <div className="sm:col-span-2 lg:col-span-5 flex flex-wrap items-center gap-3">
        <button type="submit" className="btn" disabled={progress !== null}>Upload and analyse</button>
        {progress !== null && (
          <progress className="w-64" max={1} value={progress} aria-label="Upload progress">{Math.round(progress * 100)} %</progress>
        )}
        {problem && <p className="field-error" role="alert">{problem.message}</p>}
      </div>
    </form>
  );
}
