"use client";

import { useCallback, useDeferredValue, useMemo } from "react";
import { Controller, useController, useFieldArray, useWatch } from "react-hook-form";
import type { StudyDesignInput } from "@/lib/study/design";
import { configFieldIssues, designFieldLabels, relevantFieldsPerLevel } from "@/lib/study/editor";
import { LevelSettings } from "../settings/LevelEditor";
import { PresetPicker } from "../settings/PresetPicker";
import { SettingsEditor } from "../settings/SettingsEditor";
import { Err } from "./Err";
import type { DesignControl, DesignErrors, DesignRegister } from "./formTypes";

type Config = Record<string, unknown>;
const EMPTY: Config = {};
const NONE: readonly string[] = [];

/** A preset without its display mode: the task decides how the runner draws. */
function withoutDisplayMode(c: Config): Config {
  const { displayMode: _ignored, ...rest } = c;
  return rest;
}

function FactorEditor({ control, register, errors, index, remove, base, relevantByLevel, readOnly }: { control: DesignControl; register: DesignRegister; errors: DesignErrors; index: number; remove: () => void; base: Config; relevantByLevel: readonly string[]; readOnly: boolean }) {
  const levels = useFieldArray({ control, name: `factors.${index}.levels` });
  return (
    <fieldset className="card space-y-3" aria-label={`Factor ${index + 1}`}>
      <div className="flex items-end gap-2">
        <div className="grow"><label htmlFor={`f${index}-name`}>Factor {index + 1} name</label><input id={`f${index}-name`} className="input" {...register(`factors.${index}.name`)} /></div>
        <button type="button" className="btn-secondary" onClick={remove}>Remove factor {index + 1}</button>
      </div>
      <Err errors={errors} path={`factors.${index}.name`} />
      <Err errors={errors} path={`factors.${index}.levels`} />
      {levels.fields.map((l, li) => (
        <div key={l.id} className="space-y-2 border-t border-slate-200 pt-3">
          <div className="flex items-end gap-2">
            <div className="grow">
              <label htmlFor={`f${index}-l${li}-label`}>Level {li + 1} label</label>
              <input id={`f${index}-l${li}-label`} aria-label={`Factor ${index + 1} level ${li + 1} label`} className="input" {...register(`factors.${index}.levels.${li}.label`)} />
            </div>
            <button type="button" className="btn-secondary" onClick={() => levels.remove(li)} aria-label={`Remove factor ${index + 1} level ${li + 1}`}>Remove</button>
          </div>
          <Err errors={errors} path={`factors.${index}.levels.${li}.label`} />
          <LevelConfigField control={control} factorIndex={index} levelIndex={li} base={base} relevantKeys={relevantByLevel[li] ?? ""} readOnly={readOnly} />
        </div>
      ))}
      <button type="button" className="btn-secondary" onClick={() => levels.append({ label: "", config: {} })}>Add level to factor {index + 1}</button>
    </fieldset>
  );
}

/**
 * One level's settings bound to its own form value: it re-renders when this level's settings,
 * the base or the fields that matter for it change, not on every key typed elsewhere in the form
 * (its props stay the same objects, so the memoised editor is skipped).
 */
function LevelConfigField({ control, factorIndex, levelIndex, base, relevantKeys, readOnly }: { control: DesignControl; factorIndex: number; levelIndex: number; base: Config; relevantKeys: string; readOnly: boolean }) {
  const { field } = useController({ control, name: `factors.${factorIndex}.levels.${levelIndex}.config` });
  const set = field.onChange;
  const onChange = useCallback((v: Config) => set(withoutDisplayMode(v)), [set]);
  return <LevelSettings factorIndex={factorIndex} levelIndex={levelIndex} value={(field.value ?? EMPTY) as Config} base={base} relevantKeys={relevantKeys} readOnly={readOnly} onChange={onChange} />;
}

/** The level settings of every factor (without labels and names), as one string: relevance changes only when it does. */
function levelConfigsKey(factors: StudyDesignInput["factors"] | undefined): string {
  return JSON.stringify((factors ?? []).map((f) => (f?.levels ?? []).map((l) => l?.config ?? {})));
}

/** The base settings every condition starts from, then the within-subject factors and their levels. */
export function FactorsSection({ control, register, errors, readOnly }: { control: DesignControl; register: DesignRegister; errors: DesignErrors; readOnly: boolean }) {
  const factors = useFieldArray({ control, name: "factors" });
  const baseConfig = useWatch({ control, name: "baseConfig" });
  // Only the levels' settings matter here (not labels or names); typing a label re-renders nothing
  // of this section, and the fields that matter follow the settings one frame later (deferred).
  const configsKey = useWatch({ control, name: "factors", compute: levelConfigsKey });
  const displayMode = useWatch({ control, name: "task.displayMode" });
  const base = (baseConfig ?? EMPTY) as Config;
  const baseIssues = useMemo(() => configFieldIssues(base), [base]);
  const laterBase = useDeferredValue(base), laterConfigsKey = useDeferredValue(configsKey), laterDisplayMode = useDeferredValue(displayMode);
  const relevant = useMemo(
    () => relevantFieldsPerLevel(laterBase, JSON.parse(laterConfigsKey) as Config[][], laterDisplayMode),
    [laterBase, laterConfigsKey, laterDisplayMode],
  );

  return (
    <>
      <section className="card space-y-3" aria-labelledby="base-settings-title">
        <h2 id="base-settings-title">{designFieldLabels.baseConfig}</h2>
        <p className="text-sm text-slate-700">Set here what all conditions share; each level below then changes only what it manipulates. Empty fields keep the default shown in grey.</p>
        <Controller control={control} name="baseConfig" render={({ field }) => (
          <div className="space-y-3">
            <PresetPicker id="base-preset" scope="Base" readOnly={readOnly} onApply={(cfg) => field.onChange(withoutDisplayMode(cfg))} />
            <SettingsEditor idPrefix="base" pathPrefix="baseConfig" scope="Base" value={(field.value ?? EMPTY) as Config} base={null}
              relevantKeys={relevant.base} issues={baseIssues} readOnly={readOnly} onChange={(v) => field.onChange(withoutDisplayMode(v))} />
          </div>
        )} />
      </section>

      <section className="space-y-2">
        <h2>{designFieldLabels.factors}</h2>
        <p className="text-xs text-slate-600">Each level changes some settings from the base. Every participant runs every combination of levels (a condition).</p>
        <Err errors={errors} path="factors" />
        {factors.fields.map((f, i) => <FactorEditor key={f.id} control={control} register={register} errors={errors} index={i} remove={() => factors.remove(i)} base={base} relevantByLevel={relevant.levels[i] ?? NONE} readOnly={readOnly} />)}
        <button type="button" className="btn-secondary" onClick={() => factors.append({ name: `factor_${factors.fields.length + 1}`, levels: [{ label: "", config: {} }] })}>Add factor</button>
      </section>
    </>
  );
}
