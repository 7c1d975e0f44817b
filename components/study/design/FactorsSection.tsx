"use client";

import { useMemo } from "react";
import { Controller, useFieldArray, useWatch } from "react-hook-form";
import type { StudyDesignInput } from "@/lib/study/design";
import { configFieldIssues, designFieldLabels, levelContexts, mergedConfigUnchecked, relevantFields } from "@/lib/study/editor";
import { LevelSettings } from "../settings/LevelEditor";
import { PresetPicker } from "../settings/PresetPicker";
import { SettingsEditor } from "../settings/SettingsEditor";
import { Err } from "./Err";
import type { DesignControl, DesignErrors, DesignRegister } from "./formTypes";

type Config = Record<string, unknown>;
const EMPTY: Config = {};

/** A preset without its display mode: the task decides how the runner draws. */
function withoutDisplayMode(c: Config): Config {
  const { displayMode: _ignored, ...rest } = c;
  return rest;
}

function FactorEditor({ control, register, errors, index, remove, design, readOnly }: { control: DesignControl; register: DesignRegister; errors: DesignErrors; index: number; remove: () => void; design: StudyDesignInput; readOnly: boolean }) {
  const levels = useFieldArray({ control, name: `factors.${index}.levels` });
  const base = (design.baseConfig ?? EMPTY) as Config;
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
          <Controller control={control} name={`factors.${index}.levels.${li}.config`} render={({ field }) => (
            <LevelSettingsWithContext design={design} factorIndex={index} levelIndex={li} value={(field.value ?? EMPTY) as Config} base={base}
              onChange={(v) => field.onChange(withoutDisplayMode(v))} readOnly={readOnly} />
          )} />
        </div>
      ))}
      <button type="button" className="btn-secondary" onClick={() => levels.append({ label: "", config: {} })}>Add level to factor {index + 1}</button>
    </fieldset>
  );
}

function LevelSettingsWithContext({ design, factorIndex, levelIndex, value, base, onChange, readOnly }: { design: StudyDesignInput; factorIndex: number; levelIndex: number; value: Config; base: Config; onChange: (v: Config) => void; readOnly: boolean }) {
  const relevantKeys = useMemo(() => [...relevantFields(levelContexts(design, factorIndex, levelIndex))].join(","), [design, factorIndex, levelIndex]);
  return <LevelSettings factorIndex={factorIndex} levelIndex={levelIndex} value={value} base={base} relevantKeys={relevantKeys} readOnly={readOnly} onChange={onChange} />;
}

/** The base settings every condition starts from, then the within-subject factors and their levels. */
export function FactorsSection({ control, register, errors, readOnly }: { control: DesignControl; register: DesignRegister; errors: DesignErrors; readOnly: boolean }) {
  const factors = useFieldArray({ control, name: "factors" });
  const baseConfig = useWatch({ control, name: "baseConfig" });
  const factorValues = useWatch({ control, name: "factors" });
  const displayMode = useWatch({ control, name: "task.displayMode" });
  const design = useMemo(() => ({ baseConfig, factors: factorValues, task: { displayMode } }) as StudyDesignInput, [baseConfig, factorValues, displayMode]);
  const base = (baseConfig ?? EMPTY) as Config;
  const baseIssues = useMemo(() => configFieldIssues(base), [base]);
  // The base matters for every condition: its fields follow every technique the study uses. Every
  // condition holds exactly one level of the first factor, so that factor's levels' contexts are
  // all the conditions (the other factors' would only repeat them).
  const baseRelevant = useMemo(() => {
    const all = (factorValues?.[0]?.levels ?? []).flatMap((_, li) => levelContexts(design, 0, li));
    return [...relevantFields(all.length > 0 ? all : [mergedConfigUnchecked([base], displayMode)])].join(",");
  }, [design, factorValues, base, displayMode]);

  return (
    <>
      <section className="card space-y-3" aria-labelledby="base-settings-title">
        <h2 id="base-settings-title">{designFieldLabels.baseConfig}</h2>
        <p className="text-sm text-slate-700">Set here what all conditions share; each level below then changes only what it manipulates. Empty fields keep the default shown in grey.</p>
        <Controller control={control} name="baseConfig" render={({ field }) => (
          <div className="space-y-3">
            <PresetPicker id="base-preset" scope="Base" readOnly={readOnly} onApply={(cfg) => field.onChange(withoutDisplayMode(cfg))} />
            <SettingsEditor idPrefix="base" pathPrefix="baseConfig" scope="Base" value={(field.value ?? EMPTY) as Config} base={null}
              relevantKeys={baseRelevant} issues={baseIssues} readOnly={readOnly} onChange={(v) => field.onChange(withoutDisplayMode(v))} />
          </div>
        )} />
      </section>

      <section className="space-y-2">
        <h2>{designFieldLabels.factors}</h2>
        <p className="text-xs text-slate-600">Each level changes some settings from the base. Every participant runs every combination of levels (a condition).</p>
        <Err errors={errors} path="factors" />
        {factors.fields.map((f, i) => <FactorEditor key={f.id} control={control} register={register} errors={errors} index={i} remove={() => factors.remove(i)} design={design} readOnly={readOnly} />)}
        <button type="button" className="btn-secondary" onClick={() => factors.append({ name: `factor_${factors.fields.length + 1}`, levels: [{ label: "", config: {} }] })}>Add factor</button>
      </section>
    </>
  );
}
