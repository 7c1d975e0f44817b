"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Controller, useFieldArray, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { studyDesignSchema, type StudyDesign, type StudyDesignInput } from "@/lib/study/design";
import { designFieldLabels as L } from "@/lib/study/editor";
import { apiSend, ApiError } from "./api";
import { NumberListInput, TextListInput } from "./ListInput";
import { Err } from "./design/Err";
import { FactorsSection } from "./design/FactorsSection";
import { ConditionsSection } from "./design/ConditionsSection";
import { LiveOverview } from "./design/LiveOverview";

export const EMPTY_DESIGN: StudyDesignInput = {
  baseConfig: {},
  factors: [{ name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }] }],
  task: { type: "ring", displayMode: "view", unit: "deg-view", amplitudes: [20, 40], widths: [2, 4], targetsPerRing: 13, sequencesPerAW: 1, practiceSequences: 1, selection: "tap", dwellMs: 600, trialTimeLimitMs: 10_000 },
  blocks: 1,
  minBreakSeconds: 30,
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 12,
  perConditionItems: [],
  finalQuestionnaire: { ageBand: true, handedness: true, experience: true, comments: false },
  compensation: "",
  requireTypedName: false,
  eraseOnWithdrawal: true,
  minSampleRateHz: 50,
};

/** The stored design with the display mode the runner uses written into the base settings (so replays draw alike). */
function withTaskDisplayMode(design: StudyDesign): StudyDesign {
  return { ...design, baseConfig: { ...design.baseConfig, displayMode: design.task.displayMode } };
}

/**
 * The design form: one zod schema (studyDesignSchema) for the form and the server; the settings
 * of the base and of each level are edited with the schema-generated editor; the overview
 * (summary, pictures, checks, power) follows the values once typing pauses. Each part watches only
 * the values it shows (a key re-renders the field typed in and what depends on it, not the whole form).
 */
export function DesignForm({ studyId, initial, readOnly }: { studyId: number; initial: StudyDesignInput | null; readOnly: boolean }) {
  const router = useRouter();
  const [saved, setSaved] = useState<string | null>(null);
  const form = useForm<StudyDesignInput, unknown, StudyDesign>({ resolver: zodResolver(studyDesignSchema), defaultValues: initial ? { ...EMPTY_DESIGN, ...initial } : EMPTY_DESIGN, mode: "onSubmit" });
  const { register, control, handleSubmit, setError, setValue, formState: { errors, isSubmitting } } = form;
  const items = useFieldArray({ control, name: "perConditionItems" });
  const between = useFieldArray({ control, name: "betweenFactors" });
  const widths = useWatch({ control, name: "task.widths" }) ?? [];

  const onSubmit = handleSubmit(async (design) => {
    setSaved(null);
    try {
      const r = await apiSend<{ designHash: string; amendment: boolean }>("PUT", `/api/studies/${studyId}/design`, withTaskDisplayMode(design));
      setSaved(r.amendment ? "Design saved as part of an amendment: participants keep the approved version until a reviewer approves the change." : "Design saved.");
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.issues.length) for (const i of e.issues) setError((i.path || "root") as "root", { message: i.message });
      setError("root", { message: e instanceof Error ? e.message : String(e) });
    }
  }, () => setError("root", { message: "The design has problems: each is marked at its field above." }));

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5">
      <fieldset disabled={readOnly} className="space-y-5">
        <FactorsSection control={control} register={register} errors={errors} readOnly={readOnly} />

        <section className="space-y-2">
          <h2>{L.betweenFactors} (optional)</h2>
          <p className="text-xs text-slate-600">Each participant gets one level, assigned in turn at consent; every condition above is still run by everyone.</p>
          {between.fields.map((f, i) => (
            <div key={f.id} className="grid gap-2 sm:grid-cols-[1fr_2fr_auto] sm:items-end">
              <div><label htmlFor={`b${i}-name`}>Between factor {i + 1} name</label><input id={`b${i}-name`} className="input" {...register(`betweenFactors.${i}.name`)} /></div>
              <Controller control={control} name={`betweenFactors.${i}.levels`} render={({ field }) => (
                <div><label htmlFor={`b${i}-levels`}>Its levels, comma-separated</label><TextListInput id={`b${i}-levels`} value={field.value} onChange={field.onChange} /></div>
              )} />
              <button type="button" className="btn-secondary" onClick={() => between.remove(i)}>Remove</button>
              <div className="sm:col-span-3"><Err errors={errors} path={`betweenFactors.${i}.name`} /><Err errors={errors} path={`betweenFactors.${i}.levels`} /></div>
            </div>
          ))}
          <button type="button" className="btn-secondary" onClick={() => between.append({ name: `group_${between.fields.length + 1}`, levels: ["", ""] })}>Add between-subject factor</button>
        </section>

        <ConditionsSection control={control} errors={errors} />

        <section className="card grid gap-3 sm:grid-cols-3">
          <h2 className="sm:col-span-3">Task</h2>
          <div><label htmlFor="task-type">{L.task.type}</label><select id="task-type" className="input" {...register("task.type")}><option value="ring">Multi-directional ring</option><option value="strip">One-directional</option></select></div>
          <div><label htmlFor="task-mode">{L.task.displayMode}</label><select id="task-mode" className="input" {...register("task.displayMode", { onChange: (e: { target: { value: string } }) => { if (e.target.value === "view") setValue("task.unit", "deg-view"); } })}><option value="cursor">Cursor</option><option value="view">View</option></select></div>
          <div><label htmlFor="task-unit">{L.task.unit}</label><select id="task-unit" className="input" {...register("task.unit")}><option value="px">px</option><option value="mm">mm</option><option value="deg-visual">visual degrees</option><option value="deg-view">view degrees</option></select></div>
          <div><label htmlFor="task-amplitudes">{L.task.amplitudes}</label><Controller control={control} name="task.amplitudes" render={({ field }) => <NumberListInput id="task-amplitudes" value={field.value} onChange={field.onChange} />} /><Err errors={errors} path="task.amplitudes" /></div>
          <div><label htmlFor="task-widths">{L.task.widths}</label><Controller control={control} name="task.widths" render={({ field }) => <NumberListInput id="task-widths" value={field.value} onChange={field.onChange} />} /><Err errors={errors} path="task.widths" />{widths.map((_, wi) => <Err key={wi} errors={errors} path={`task.widths.${wi}`} />)}</div>
          <div><label htmlFor="task-targets">{L.task.targetsPerRing}</label><input id="task-targets" type="number" className="input" {...register("task.targetsPerRing", { valueAsNumber: true })} /><Err errors={errors} path="task.targetsPerRing" /></div>
          <div><label htmlFor="task-seq">{L.task.sequencesPerAW}</label><input id="task-seq" type="number" className="input" {...register("task.sequencesPerAW", { valueAsNumber: true })} /><Err errors={errors} path="task.sequencesPerAW" /></div>
          <div><label htmlFor="task-practice">{L.task.practiceSequences}</label><input id="task-practice" type="number" className="input" {...register("task.practiceSequences", { valueAsNumber: true })} /><Err errors={errors} path="task.practiceSequences" /></div>
          <div><label htmlFor="task-selection">{L.task.selection}</label><select id="task-selection" className="input" {...register("task.selection")}><option value="button">Button</option><option value="tap">Tap</option><option value="click">Click</option><option value="dwell">Dwell</option></select></div>
          <div><label htmlFor="task-dwell">{L.task.dwellMs}</label><input id="task-dwell" type="number" className="input" {...register("task.dwellMs", { valueAsNumber: true })} /><Err errors={errors} path="task.dwellMs" /></div>
          <div><label htmlFor="task-limit">{L.task.trialTimeLimitMs}</label><input id="task-limit" type="number" className="input" {...register("task.trialTimeLimitMs", { valueAsNumber: true })} /><Err errors={errors} path="task.trialTimeLimitMs" /></div>
        </section>

        <section className="card grid gap-3 sm:grid-cols-3">
          <h2 className="sm:col-span-3">Blocks, breaks, participants</h2>
          <div><label htmlFor="blocks">{L.blocks}</label><input id="blocks" type="number" className="input" {...register("blocks", { valueAsNumber: true })} /><Err errors={errors} path="blocks" /></div>
          <div><label htmlFor="min-break">{L.minBreakSeconds}</label><input id="min-break" type="number" className="input" {...register("minBreakSeconds", { valueAsNumber: true })} /><Err errors={errors} path="minBreakSeconds" /></div>
          <div><label htmlFor="planned">{L.plannedParticipants}</label><input id="planned" type="number" className="input" {...register("plannedParticipants", { valueAsNumber: true })} /><Err errors={errors} path="plannedParticipants" /></div>
          <div>
            <label htmlFor="min-rate">{L.minSampleRateHz}</label><input id="min-rate" type="number" className="input" aria-describedby="min-rate-about" {...register("minSampleRateHz", { valueAsNumber: true })} />
            <p id="min-rate-about" className="text-xs text-slate-600">The device check refuses slower motion sensors (10–1000 Hz; phones through DeviceMotion report about 60 Hz).</p>
            <Err errors={errors} path="minSampleRateHz" />
          </div>
          <div className="sm:col-span-2 space-y-1 text-sm">
            <label className="flex items-center gap-2"><input type="checkbox" {...register("requireTypedName")} /> {L.requireTypedName}</label>
            <label className="flex items-center gap-2"><input type="checkbox" {...register("eraseOnWithdrawal")} /> {L.eraseOnWithdrawal}</label>
            <p className="text-xs text-slate-600">Follow what your ethics board approved and local law: a typed name is personal data, and erasure on withdrawal is what most consent texts promise.</p>
          </div>
          <div className="sm:col-span-3"><label htmlFor="compensation">{L.compensation}</label><input id="compensation" className="input" {...register("compensation")} /></div>
        </section>

        <section className="card space-y-2">
          <h2>Questionnaires</h2>
          <p className="text-sm">{L.perConditionItems} (Likert items, your own wording):</p>
          {items.fields.map((it, i) => (
            <div key={it.id} className="grid gap-2 sm:grid-cols-[8rem_1fr_8rem_8rem_5rem_auto]">
              <input aria-label={`Item ${i + 1} id`} className="input" {...register(`perConditionItems.${i}.id`)} />
              <input aria-label={`Item ${i + 1} text`} className="input" {...register(`perConditionItems.${i}.text`)} />
              <input aria-label={`Item ${i + 1} low label`} className="input" {...register(`perConditionItems.${i}.lowLabel`)} />
              <input aria-label={`Item ${i + 1} high label`} className="input" {...register(`perConditionItems.${i}.highLabel`)} />
              <select aria-label={`Item ${i + 1} points`} className="input" {...register(`perConditionItems.${i}.points`, { setValueAs: (v) => Number(v) as 5 | 7 })}><option value={7}>7</option><option value={5}>5</option></select>
              <button type="button" className="btn-secondary" onClick={() => items.remove(i)}>Remove</button>
              <div className="sm:col-span-6"><Err errors={errors} path={`perConditionItems.${i}.id`} /><Err errors={errors} path={`perConditionItems.${i}.text`} /></div>
            </div>
          ))}
          <button type="button" className="btn-secondary" onClick={() => items.append({ id: `item_${items.fields.length + 1}`, text: "", points: 7, lowLabel: "not at all", highLabel: "very much" })}>Add item</button>
          <p className="text-sm">{L.finalQuestionnaire}:</p>
          <div className="flex flex-wrap gap-4 text-sm">
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.ageBand")} /> Age band</label>
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.handedness")} /> Handedness</label>
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.experience")} /> Experience with the input techniques</label>
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.comments")} /> Free comments</label>
          </div>
        </section>

        <section className="card grid gap-3 sm:grid-cols-3">
          <h2 className="sm:col-span-3">{L.counterbalancing}</h2>
          <div><label htmlFor="cb-method">Method</label><select id="cb-method" className="input" {...register("counterbalancing.method")}><option value="williams">Balanced Latin square (Williams)</option><option value="cyclic">Cyclic Latin square</option><option value="all-orders">All orders (at most 4 conditions)</option><option value="random">Random, from a stored seed</option></select><Err errors={errors} path="counterbalancing.method" /></div>
          <div><label htmlFor="cb-seed">Seed (random method)</label><input id="cb-seed" type="number" className="input" {...register("counterbalancing.seed", { valueAsNumber: true })} /><Err errors={errors} path="counterbalancing.seed" /></div>
        </section>
      </fieldset>

      {errors.root && <p className="field-error" role="alert">{errors.root.message}</p>}
      {saved && <p className="notice" role="status">{saved}</p>}
      {!readOnly && <button className="btn" disabled={isSubmitting}>Save design</button>}

      <LiveOverview control={control} studyId={studyId} />
    </form>
  );
}
