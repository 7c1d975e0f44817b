"use client";

import { useState } from "react";
import { presetNames, presets, type PresetName } from "@/lib/motion/presets";
import { presetNotes } from "@/lib/study/editor";

/** Start a level (or the base) from a named preset; the sentence says when to use it. */
export function PresetPicker({ id, scope, readOnly, onApply }: { id: string; scope: string; readOnly: boolean; onApply: (config: Record<string, unknown>, name: PresetName) => void }) {
  const [chosen, setChosen] = useState<PresetName | "">("");
  return (
    <div className="space-y-1">
      <div className="flex flex-wrap items-end gap-2">
        <div className="grow">
          <label htmlFor={id}>Start from a preset</label>
          <select id={id} aria-label={`${scope} preset`} className="input" value={chosen} disabled={readOnly} onChange={(e) => setChosen(e.target.value as PresetName | "")}>
            <option value="">(choose a preset)</option>
            {presetNames.map((n) => <option key={n} value={n}>{presetNotes[n].title}</option>)}
          </select>
        </div>
        <button type="button" className="btn-secondary" disabled={readOnly || chosen === ""} aria-label={`${scope}: apply preset`}
          onClick={() => { if (chosen !== "") onApply({ ...presets[chosen] }, chosen); }}>Apply preset</button>
      </div>
      {chosen !== "" && <p className="text-xs text-slate-700" id={`${id}-when`}>{presetNotes[chosen].when} Applying it replaces this {scope === "Base" ? "base's" : "level's"} settings.</p>}
    </div>
  );
}
