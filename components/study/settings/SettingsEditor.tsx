"use client";

import { useCallback, useMemo, useRef, useState } from "react";
import { defaultTransferConfig, transferConfigSchema } from "@/lib/motion/config";
import { configFieldCatalogue, configFieldKeys, configGroups, fieldSpecOf, type ConfigFieldIssue, type FieldSpec } from "@/lib/study/editor";
import { FieldRow, type Inherited } from "./FieldRow";

type Config = Record<string, unknown>;

/** Each field's range, default and choices, read once from the configuration's schema. */
const SPECS: Record<string, FieldSpec> = Object.fromEntries(
  configFieldKeys.map((k) => [k, fieldSpecOf(k, transferConfigSchema.shape[k as keyof typeof transferConfigSchema.shape])]),
);

/**
 * A transfer-configuration editor generated from the schema (lib/motion/config.ts) and the
 * editor's catalogue (lib/study/editor): fields grouped as a researcher decides, only those that
 * matter for the technique(s) this level meets unless "every setting" is asked for, each with
 * its unit, range, default or inherited value, and its error at the field.
 */
export function SettingsEditor({ idPrefix, pathPrefix, scope, value, base, relevantKeys, issues, readOnly, onChange }: {
  idPrefix: string;
  pathPrefix: string;
  scope: string;
  value: Config;
  /** The study-wide base settings a level inherits from; null when this is the base. */
  base: Config | null;
  /** The fields that matter for the configurations this level takes part in, comma-separated (relevantFieldKeys). */
  relevantKeys: string;
  issues: ConfigFieldIssue[];
  readOnly: boolean;
  onChange: (v: Config) => void;
}) {
  const [showAll, setShowAll] = useState(false);
  const latest = useRef(value);
  latest.current = value;
  const changeRef = useRef(onChange);
  changeRef.current = onChange;
  // Stable across renders, so unchanged fields (memoised) do not re-render while one is typed in.
  const onSet = useCallback((field: string, v: unknown) => {
    const next = { ...latest.current };
    if (v === undefined) delete next[field];
    else next[field] = v;
    latest.current = next;
    changeRef.current(next);
  }, []);

  const relevant = useMemo(() => new Set(relevantKeys.split(",")), [relevantKeys]);
  const errors = useMemo(() => new Map(issues.map((i) => [i.field, i.message])), [issues]);
  const general = issues.filter((i) => i.field === "" || !(i.field in configFieldCatalogue));

  const inheritedOf = (field: string): Inherited =>
    base && field in base ? { value: base[field], from: "base" } : { value: (defaultTransferConfig as Record<string, unknown>)[field], from: "default" };

  return (
    <div className="space-y-3" data-testid={`settings-${idPrefix}`}>
      <label className="flex items-center gap-2 text-xs font-normal">
        <input type="checkbox" checked={showAll} onChange={(e) => setShowAll(e.target.checked)} /> Show every setting (also those this technique does not use, and rarely changed ones)
      </label>
      {general.map((g) => <p key={g.field + g.message} className="field-error" role="alert">{g.field ? `${g.field}: ` : ""}{g.message}</p>)}
      {configGroups.map((group) => {
        const fields = configFieldKeys.filter((k) => {
          const e = configFieldCatalogue[k];
          if (e.group !== group.id) return false;
          if (showAll || k in value || errors.has(k)) return true;
          return relevant.has(k) && !e.advanced && !(e.setElsewhere && base !== null);
        });
        if (fields.length === 0) return null;
        return (
          <fieldset key={group.id} className="rounded border border-slate-200 p-3" aria-label={`${scope}: ${group.title}`}>
            <legend className="px-1 text-sm font-semibold">{group.title}</legend>
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
              {fields.map((k) => (
                <FieldRow key={k} id={`${idPrefix}-${k}`} path={`${pathPrefix}.${k}`} scope={scope} field={k}
                  entry={configFieldCatalogue[k]} spec={SPECS[k]!} value={value[k]} inheritedValue={inheritedOf(k).value} inheritedFrom={inheritedOf(k).from}
                  error={errors.get(k)} unused={!relevant.has(k)} readOnly={readOnly} onSet={onSet} />
              ))}
            </div>
          </fieldset>
        );
      })}
    </div>
  );
}
