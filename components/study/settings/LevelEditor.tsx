"use client";

import { memo, useMemo, useState } from "react";
import { changesFromBase, formatSetting, levelFieldIssues } from "@/lib/study/editor";
import { PresetPicker } from "./PresetPicker";
import { SettingsEditor } from "./SettingsEditor";

type Config = Record<string, unknown>;

/** One level's transfer settings: what it changes from the base, a preset, and the generated editor. */
export const LevelSettings = memo(function LevelSettings({ factorIndex, levelIndex, value, base, relevantKeys, readOnly, onChange }: {
  factorIndex: number;
  levelIndex: number;
  value: Config;
  base: Config;
  relevantKeys: string;
  readOnly: boolean;
  onChange: (v: Config) => void;
}) {
  const scope = `Factor ${factorIndex + 1} level ${levelIndex + 1}`;
  const issues = useMemo(() => levelFieldIssues(base, value), [base, value]);
  const changes = useMemo(() => changesFromBase(base, value), [base, value]);
  const [open, setOpen] = useState(Object.keys(value).length === 0);
  const expanded = open || issues.length > 0;
  return (
    <div className="space-y-2">
      <p className="text-sm" aria-label={`${scope} changes from the base`}>
        {changes.length === 0 ? <span className="text-slate-600">Same as the base settings.</span> : <>Changes from the base: {changes.map((c, i) => (
          <span key={c.field}>{i > 0 ? "; " : ""}<strong>{c.label}</strong> {formatSetting(c.from)} → {formatSetting(c.to)}{c.unit && typeof c.to === "number" ? ` ${c.unit}` : ""}</span>
        ))}</>}
      </p>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-secondary" aria-expanded={expanded} onClick={() => setOpen(!open)} disabled={issues.length > 0 && open}>
          {expanded ? "Hide" : "Edit"} settings of {scope.toLowerCase()}
        </button>
      </div>
      {expanded && (
        <div className="space-y-3 rounded border border-slate-200 bg-slate-50 p-3">
          <PresetPicker id={`f${factorIndex}-l${levelIndex}-preset`} scope={scope} readOnly={readOnly} onApply={(cfg) => onChange(cfg)} />
          <SettingsEditor idPrefix={`f${factorIndex}-l${levelIndex}`} pathPrefix={`factors.${factorIndex}.levels.${levelIndex}.config`} scope={scope}
            value={value} base={base} relevantKeys={relevantKeys} issues={issues} readOnly={readOnly} onChange={onChange} />
        </div>
      )}
    </div>
  );
});
