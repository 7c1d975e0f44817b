"use client";
import type { ExclusionRule } from "@/lib/analysis/options";
import type { FlagColumn } from "@/lib/trials/columns";

export interface ExclusionChoice {
  exclude: ExclusionRule;
  drop: FlagColumn[];
}

const RULES: { value: ExclusionRule; label: string }[] = [
  { value: "misfire", label: "misfires (shorter than A/2 or more than 2W off)" },
  { value: "mt3sd", label: "movement times beyond mean ± 3 SD (per participant × condition)" },
  { value: "misfire+mt3sd", label: "misfires, then movement times beyond ± 3 SD" },
  { value: "none", label: "none" },
];
const FLAGS: { value: FlagColumn; label: string }[] = [
  { value: "timed_out", label: "timed out" },
  { value: "recentered", label: "recentered" },
  { value: "clutched", label: "clutched" },
];

/** The exclusion rule and the flagged movements to remove; the page recomputes on change. */
export function ExclusionControls({ value, onChange, busy }: { value: ExclusionChoice; onChange: (v: ExclusionChoice) => void; busy: boolean }) {
  return (
    <section className="card flex flex-wrap items-end gap-4 print:hidden" aria-labelledby="rules-title">
      <h2 id="rules-title" className="w-full text-base">Exclusion rules</h2>
      <div className="space-y-1">
        <label htmlFor="exclude-rule">Remove</label>
        <select id="exclude-rule" className="input" value={value.exclude} onChange={(e) => onChange({ ...value, exclude: e.target.value as ExclusionRule })}>
          {RULES.map((r) => <option key={r.value} value={r.value}>{r.label}</option>)}
        </select>
      </div>
      <fieldset className="space-y-1">
        <legend className="text-sm">Also remove flagged movements (time-outs otherwise count as errors)</legend>
        <div className="flex flex-wrap gap-4 text-sm">
          {FLAGS.map((f) => (
            <label key={f.value}>
              <input
                type="checkbox"
                checked={value.drop.includes(f.value)}
                onChange={(e) => onChange({ ...value, drop: e.target.checked ? [...value.drop, f.value] : value.drop.filter((d) => d !== f.value) })}
              />{" "}
              {f.label}
            </label>
          ))}
        </div>
      </fieldset>
      {busy && <p role="status" className="text-sm">Recomputing…</p>}
    </section>
  );
}
