"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { Controller, useFieldArray, useForm, type Control, type FieldErrors, type UseFormRegister } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { studyDesignSchema, CONDITION_SEPARATOR, type StudyDesign, type StudyDesignInput } from "@/lib/study/design";
import { designSummary, PLANNING } from "@/lib/study/summary/designSummary";
import { orderPreview } from "@/lib/study/summary/orderPreview";
import { apiSend, ApiError } from "./api";
import { ConfigInput, NumberListInput, TextListInput } from "./ListInput";

type Errors = FieldErrors<StudyDesignInput>;

/** The message at a dotted path of the form's errors (react-hook-form nests them like the values). */
function errorAt(errors: Errors, path: string): string | undefined {
  let node: unknown = errors;
  for (const key of path.split(".")) node = node && typeof node === "object" ? (node as Record<string, unknown>)[key] : undefined;
  const m = node && typeof node === "object" ? (node as { message?: unknown; root?: { message?: unknown } }) : undefined;
  const msg = m?.message ?? m?.root?.message;
  return typeof msg === "string" ? msg : undefined;
}

function Err({ errors, path }: { errors: Errors; path: string }) {
  const m = errorAt(errors, path);
  return m ? <p className="field-error" role="alert" id={`err-${path}`}>{m}</p> : null;
}

const PARAMS_HINT = "Settings: technique (motion, stick, motion+stick, motion+touch, mouse, touch, tilt-rate), gain, gainCurve (constant, two-level, power), frame (device, gravity, adaptive), smoothingTimeMs, clutchMode (hold, toggle), activation (always, while-aiming), deadBandDegPerS, addedLatencyMs …";

export const EMPTY_DESIGN: StudyDesignInput = {
  factors: [{ name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }] }],
  task: { type: "ring", displayMode: "view", unit: "deg-view", amplitudes: [20, 40], widths: [2, 4], targetsPerRing: 13, sequencesPerAW: 1, practiceSequences: 1, selection: "tap", dwellMs: 600, trialTimeLimitMs: 10_000 },
  blocks: 1,
  minBreakSeconds: 30,
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 12,
  perConditionItems: [],
  finalQuestionnaire: { ageBand: true, handedness: true, experience: true, comments: false },
  compensation: "",
};

function FactorEditor({ control, register, errors, index, remove }: { control: Control<StudyDesignInput, unknown, StudyDesign>; register: UseFormRegister<StudyDesignInput>; errors: Errors; index: number; remove: () => void }) {
  const levels = useFieldArray({ control, name: `factors.${index}.levels` });
  return (
    <fieldset className="card space-y-2" aria-label={`Factor ${index + 1}`}>
      <div className="flex items-end gap-2">
        <div className="grow"><label htmlFor={`f${index}-name`}>Factor {index + 1} name</label><input id={`f${index}-name`} className="input" {...register(`factors.${index}.name`)} /></div>
        <button type="button" className="btn-secondary" onClick={remove}>Remove factor {index + 1}</button>
      </div>
      <Err errors={errors} path={`factors.${index}.name`} />
      <Err errors={errors} path={`factors.${index}.levels`} />
      {levels.fields.map((l, li) => (
        <div key={l.id} className="grid grid-cols-[12rem_1fr_auto] items-start gap-2">
          <div>
            <input aria-label={`Factor ${index + 1} level ${li + 1} label`} className="input" {...register(`factors.${index}.levels.${li}.label`)} />
            <Err errors={errors} path={`factors.${index}.levels.${li}.label`} />
          </div>
          <Controller control={control} name={`factors.${index}.levels.${li}.config`} render={({ field }) => <ConfigInput id={`f${index}-l${li}-config`} label={`Factor ${index + 1} level ${li + 1} settings`} value={field.value} onChange={field.onChange} />} />
          <button type="button" className="btn-secondary" onClick={() => levels.remove(li)} aria-label={`Remove factor ${index + 1} level ${li + 1}`}>Remove</button>
        </div>
      ))}
      <button type="button" className="btn-secondary" onClick={() => levels.append({ label: "", config: {} })}>Add level to factor {index + 1}</button>
    </fieldset>
  );
}

/** The design form: one zod schema (studyDesignSchema) for the form and the server; preview and summary update as you type. */
export function DesignForm({ studyId, initial, readOnly }: { studyId: number; initial: StudyDesignInput | null; readOnly: boolean }) {
  const router = useRouter();
  const [saved, setSaved] = useState<string | null>(null);
  const form = useForm<StudyDesignInput, unknown, StudyDesign>({ resolver: zodResolver(studyDesignSchema), defaultValues: initial ?? EMPTY_DESIGN, mode: "onSubmit" });
  const { register, control, handleSubmit, watch, setError, formState: { errors, isSubmitting } } = form;
  const factors = useFieldArray({ control, name: "factors" });
  const items = useFieldArray({ control, name: "perConditionItems" });
  const between = useFieldArray({ control, name: "betweenFactors" });
  const values = watch();
  const parsed = useMemo(() => studyDesignSchema.safeParse(values), [values]);
  const crossing = useMemo(() => {
    let combos: string[][] = [[]];
    for (const f of values.factors ?? []) combos = combos.flatMap((c) => (f.levels ?? []).map((l) => [...c, l.label]));
    return combos.map((c) => c.join(CONDITION_SEPARATOR));
  }, [values]);
  const subset = values.conditionSubset ?? null;

  const onSubmit = handleSubmit(async (design) => {
    setSaved(null);
    try {
      const r = await apiSend<{ designHash: string; backToDraft: boolean }>("PUT", `/api/studies/${studyId}/design`, design);
      setSaved(r.backToDraft ? "Design saved. It changed after approval, so the study is a draft again and needs a new review." : "Design saved.");
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.issues.length) for (const i of e.issues) setError((i.path || "root") as "root", { message: i.message });
      setError("root", { message: e instanceof Error ? e.message : String(e) });
    }
  });

  let preview: ReturnType<typeof orderPreview> | null = null;
  let summary: ReturnType<typeof designSummary> | null = null;
  let previewError: string | null = null;
  if (parsed.success) {
    try {
      preview = orderPreview(parsed.data);
      summary = designSummary(parsed.data);
    } catch (e) {
      previewError = e instanceof Error ? e.message : String(e);
    }
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5">
      <fieldset disabled={readOnly} className="space-y-5">
        <section className="space-y-2">
          <h2>Within-subject factors</h2>
          <p className="text-xs text-slate-600">{PARAMS_HINT}</p>
          <Err errors={errors} path="factors" />
          {factors.fields.map((f, i) => <FactorEditor key={f.id} control={control} register={register} errors={errors} index={i} remove={() => factors.remove(i)} />)}
          <button type="button" className="btn-secondary" onClick={() => factors.append({ name: `factor_${factors.fields.length + 1}`, levels: [{ label: "", config: {} }] })}>Add factor</button>
        </section>

        <section className="space-y-2">
          <h2>Between-subject factors (optional)</h2>
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

        <section className="space-y-2">
          <h2>Conditions</h2>
          <Controller control={control} name="conditionSubset" render={({ field }) => (
            <div className="space-y-1 text-sm">
              <label className="flex items-center gap-2"><input type="checkbox" checked={field.value !== null && field.value !== undefined} onChange={(e) => field.onChange(e.target.checked ? [...crossing] : null)} /> Use only some of the {crossing.length} crossed conditions</label>
              {subset !== null && crossing.map((c) => (
                <label key={c} className="ml-6 flex items-center gap-2"><input type="checkbox" checked={subset.includes(c)} onChange={(e) => field.onChange(e.target.checked ? [...subset, c] : subset.filter((x) => x !== c))} /> {c}</label>
              ))}
            </div>
          )} />
          <Err errors={errors} path="conditionSubset" />
        </section>

        <section className="card grid gap-3 sm:grid-cols-3">
          <h2 className="sm:col-span-3">Task</h2>
          <div><label htmlFor="task-type">Task type</label><select id="task-type" className="input" {...register("task.type")}><option value="ring">Multi-directional ring</option><option value="strip">One-directional</option></select></div>
          <div><label htmlFor="task-mode">Display mode</label><select id="task-mode" className="input" {...register("task.displayMode")}><option value="cursor">Cursor</option><option value="view">View</option></select></div>
          <div><label htmlFor="task-unit">Unit</label><select id="task-unit" className="input" {...register("task.unit")}><option value="px">px</option><option value="mm">mm</option><option value="deg-visual">visual degrees</option><option value="deg-view">view degrees</option></select></div>
          <div><label htmlFor="task-amplitudes">Amplitudes (A)</label><Controller control={control} name="task.amplitudes" render={({ field }) => <NumberListInput id="task-amplitudes" value={field.value} onChange={field.onChange} />} /><Err errors={errors} path="task.amplitudes" /></div>
          <div><label htmlFor="task-widths">Widths (W)</label><Controller control={control} name="task.widths" render={({ field }) => <NumberListInput id="task-widths" value={field.value} onChange={field.onChange} />} /><Err errors={errors} path="task.widths" />{(values.task?.widths ?? []).map((_, wi) => <Err key={wi} errors={errors} path={`task.widths.${wi}`} />)}</div>
          <div><label htmlFor="task-targets">Targets per ring (odd)</label><input id="task-targets" type="number" className="input" {...register("task.targetsPerRing", { valueAsNumber: true })} /><Err errors={errors} path="task.targetsPerRing" /></div>
          <div><label htmlFor="task-seq">Sequences per A×W</label><input id="task-seq" type="number" className="input" {...register("task.sequencesPerAW", { valueAsNumber: true })} /><Err errors={errors} path="task.sequencesPerAW" /></div>
          <div><label htmlFor="task-practice">Practice sequences</label><input id="task-practice" type="number" className="input" {...register("task.practiceSequences", { valueAsNumber: true })} /><Err errors={errors} path="task.practiceSequences" /></div>
          <div><label htmlFor="task-selection">Selection</label><select id="task-selection" className="input" {...register("task.selection")}><option value="button">Button</option><option value="tap">Tap</option><option value="click">Click</option><option value="dwell">Dwell</option></select></div>
          <div><label htmlFor="task-dwell">Dwell time (ms)</label><input id="task-dwell" type="number" className="input" {...register("task.dwellMs", { valueAsNumber: true })} /><Err errors={errors} path="task.dwellMs" /></div>
          <div><label htmlFor="task-limit">Time limit per trial (ms)</label><input id="task-limit" type="number" className="input" {...register("task.trialTimeLimitMs", { valueAsNumber: true })} /><Err errors={errors} path="task.trialTimeLimitMs" /></div>
        </section>

        <section className="card grid gap-3 sm:grid-cols-3">
          <h2 className="sm:col-span-3">Blocks, breaks, participants</h2>
          <div><label htmlFor="blocks">Blocks</label><input id="blocks" type="number" className="input" {...register("blocks", { valueAsNumber: true })} /><Err errors={errors} path="blocks" /></div>
          <div><label htmlFor="min-break">Minimum break (s)</label><input id="min-break" type="number" className="input" {...register("minBreakSeconds", { valueAsNumber: true })} /><Err errors={errors} path="minBreakSeconds" /></div>
          <div><label htmlFor="planned">Planned participants (N)</label><input id="planned" type="number" className="input" {...register("plannedParticipants", { valueAsNumber: true })} /><Err errors={errors} path="plannedParticipants" /></div>
          <div className="sm:col-span-3"><label htmlFor="compensation">Compensation (shown in invitations)</label><input id="compensation" className="input" {...register("compensation")} /></div>
        </section>

        <section className="card space-y-2">
          <h2>Questionnaires</h2>
          <p className="text-sm">After each condition (Likert items, your own wording):</p>
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
          <p className="text-sm">At the end:</p>
          <div className="flex flex-wrap gap-4 text-sm">
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.ageBand")} /> Age band</label>
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.handedness")} /> Handedness</label>
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.experience")} /> Experience with the input techniques</label>
            <label className="flex items-center gap-1"><input type="checkbox" {...register("finalQuestionnaire.comments")} /> Free comments</label>
          </div>
        </section>

        <section className="card grid gap-3 sm:grid-cols-3">
          <h2 className="sm:col-span-3">Counterbalancing</h2>
          <div><label htmlFor="cb-method">Method</label><select id="cb-method" className="input" {...register("counterbalancing.method")}><option value="williams">Balanced Latin square (Williams)</option><option value="cyclic">Cyclic Latin square</option><option value="all-orders">All orders (at most 4 conditions)</option><option value="random">Random, from a stored seed</option></select></div>
          <div><label htmlFor="cb-seed">Seed (random method)</label><input id="cb-seed" type="number" className="input" {...register("counterbalancing.seed", { valueAsNumber: true })} /><Err errors={errors} path="counterbalancing.seed" /></div>
        </section>
      </fieldset>

      {errors.root && <p className="field-error" role="alert">{errors.root.message}</p>}
      {saved && <p className="notice" role="status">{saved}</p>}
      {!readOnly && <button className="btn" disabled={isSubmitting}>Save design</button>}

      <section className="space-y-2" aria-label="Design summary">
        <h2>Summary</h2>
        {!parsed.success && <p className="text-sm">The summary appears when the design is valid ({parsed.error.issues[0]?.path.join(".")}: {parsed.error.issues[0]?.message}).</p>}
        {previewError && <p className="field-error" role="alert">{previewError}</p>}
        {summary && (
          <div className="card space-y-2 text-sm">
            <p><strong>{summary.conditions.length}</strong> conditions · <strong>{summary.trialsPerParticipant}</strong> trials per participant (+{summary.practiceTrialsPerParticipant} practice) · about <strong>{summary.estimatedMinutes} minutes</strong> · {summary.totalTrials} trials for N = {values.plannedParticipants}.</p>
            <p className="text-xs text-slate-600">Time estimate: {PLANNING.secondsPerMovement} s per movement, {PLANNING.secondsPerSequenceSetup} s per sequence, the minimum breaks, {PLANNING.setupMinutes} min for consent and calibration.</p>
            <table><thead><tr><th>#</th><th>Condition</th><th>IDs (bits) of its A×W</th></tr></thead>
              <tbody>{summary.conditions.map((c) => <tr key={c.index}><td>{c.index + 1}</td><td>{c.label}</td><td>{summary!.difficulties.map((d) => `A${d.amplitude}/W${d.width}: ${d.id.toFixed(2)}`).join(" · ")}</td></tr>)}</tbody>
            </table>
          </div>
        )}
        {preview && (
          <div className="space-y-2">
            <h3 className="font-semibold">Condition order per participant ({preview.rows} rows)</h3>
            {preview.warning && <p className="notice" role="alert">Warning: {preview.warning}</p>}
            <div className="card max-h-80 overflow-auto p-0">
              <table aria-label="Order preview"><thead><tr><th>Participant</th><th>Row</th>{preview.participants[0]?.order.map((_, i) => <th key={i}>{i + 1}.</th>)}</tr></thead>
                <tbody>{preview.participants.map((p) => <tr key={p.participant}><td>{p.participant}</td><td>{p.row + 1}</td>{p.order.map((c, i) => <td key={i}>{c}</td>)}</tr>)}</tbody>
              </table>
            </div>
          </div>
        )}
      </section>
    </form>
  );
}
