"use client";
import { useEffect, useState } from "react";
import { consentBlocks } from "@/lib/runner/consent";
import { FINAL_CHOICES, MAX_COMMENT_CHARS } from "@/lib/runner/finalChoices";
import type { StudyDesign } from "@/lib/study/design";
import type { Technique } from "@/lib/motion/config";
import type { ControlHelp } from "@/lib/runner/controls";
import { usesMotion } from "@/lib/runner/inputPaths";

/** How the participant aims, in a few words, for the information page. */
function aimingSentence(techniques: readonly Technique[]): string {
  const motion = techniques.some(usesMotion);
  const others: string[] = [];
  if (techniques.some((t) => t === "stick" || t === "motion+stick")) others.push("a game controller's thumbstick");
  if (techniques.includes("mouse")) others.push("a mouse");
  if (techniques.some((t) => t === "touch" || t === "motion+touch")) others.push("your finger on the screen");
  if (motion) return `You will aim by turning your device${others.length ? `, and with ${others.join(" and ")}` : ""}.`;
  return `You will aim with ${others.join(" and ") || "the inputs this page asks for"}.`;
}

export function InfoStep(props: { title: string; summary: string; compensation: string; viewMode: boolean; techniques: readonly Technique[]; onNext: () => void }) {
  const motion = props.techniques.some(usesMotion);
  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">{props.title}</h1>
      <p className="whitespace-pre-line">{props.summary}</p>
      {props.compensation && <p><strong>Compensation:</strong> {props.compensation}</p>}
      <div className="notice space-y-1" role="note">
        <h2 className="font-semibold">Before you start</h2>
        <ul className="list-disc pl-5">
          <li>{aimingSentence(props.techniques)} {motion ? "Repeated wrist rotation can strain" : "Repeated hand movements can strain"}: rest whenever you need to.</li>
          {props.viewMode && <li>The view turns as you move. Turning views can cause motion sickness: stop at once if you feel unwell.</li>}
          <li>Targets are highlighted one at a time and nothing flashes, but the highlight moves often. If changing highlights affect you (photosensitivity), do not take part.</li>
          <li>You can stop at any time, without giving a reason, with “Stop and withdraw” at the top of every page.</li>
          <li>The approving ethics board and the law where you live set the rules for this study; the consent text on the next page explains them.</li>
        </ul>
      </div>
      <button type="button" className="btn w-full sm:w-auto" onClick={props.onNext}>Continue</button>
    </section>
  );
}

export function ConsentStep(props: { body: string; requireName: boolean; busy: boolean; error: string | null; onSign: (v: { agreed: string[]; typedName?: string; email?: string }) => void }) {
  const blocks = consentBlocks(props.body);
  const required = blocks.flatMap((b) => (b.kind === "statement" ? [b.id] : []));
  const [agreed, setAgreed] = useState<string[]>([]);
  const [name, setName] = useState("");
  const [email, setEmail] = useState("");
  const ready = required.every((id) => agreed.includes(id)) && (!props.requireName || name.trim().length >= 2);
  return (
    <form className="space-y-3" onSubmit={(e) => {
      e.preventDefault();
      if (ready) props.onSign({ agreed, ...(props.requireName ? { typedName: name.trim() } : {}), ...(email.trim() ? { email: email.trim() } : {}) });
    }}>
      <h1 className="text-xl font-semibold">Consent</h1>
      <div className="card max-h-[50vh] space-y-2 overflow-y-auto" data-testid="consent-text">
        {blocks.map((b, i) =>
          b.kind === "heading" ? <h2 key={i} className="font-semibold">{b.text}</h2>
          : b.kind === "paragraph" ? <p key={i}>{b.text}</p>
          : b.kind === "item" ? <p key={i} className="pl-4">• {b.text}</p>
          : null,
        )}
      </div>
      <fieldset className="space-y-2">
        <legend className="font-semibold">Please confirm each statement</legend>
        {blocks.map((b) => b.kind === "statement" && (
          <label key={b.id} className="flex items-start gap-2">
            <input type="checkbox" className="mt-1 h-5 w-5" checked={agreed.includes(b.id)} onChange={(e) => setAgreed(e.target.checked ? [...agreed, b.id] : agreed.filter((x) => x !== b.id))} />
            <span>{b.text}</span>
          </label>
        ))}
      </fieldset>
      {props.requireName && (
        <label className="block">Type your full name to sign
          <input className="input w-full" value={name} onChange={(e) => setName(e.target.value)} autoComplete="name" />
        </label>
      )}
      <label className="block">E-mail for a copy of this consent (optional; not stored with your data)
        <input className="input w-full" type="email" value={email} onChange={(e) => setEmail(e.target.value)} autoComplete="email" />
      </label>
      {props.error && <p className="field-error" role="alert">{props.error}</p>}
      <button type="submit" className="btn w-full sm:w-auto" disabled={!ready || props.busy}>I agree and take part</button>
    </form>
  );
}

/** One technique's controls, as the instructions show them. */
export interface TechniqueControls {
  technique: Technique;
  help: ControlHelp;
  /** The conditions these controls belong to. */
  conditions: string[];
}

const TECHNIQUE_TITLES: Record<Technique, string> = {
  motion: "Turning the device", stick: "Thumbstick", "motion+stick": "Turning the device with the thumbstick", "motion+touch": "Turning the device with a touch drag",
  mouse: "Mouse", touch: "Touch", "tilt-rate": "Tilting the device",
};

export function InstructionsStep(props: { displayMode: "cursor" | "view"; controls: readonly TechniqueControls[]; practice: boolean; onNext: () => void }) {
  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">How the task works</h1>
      <p>{props.displayMode === "view" ? "The view turns as you aim; the cross in the middle is where you aim." : "A small cross shows where you aim."} Select the highlighted target, as quickly as you can while staying accurate. The first selection of each round only starts it.</p>
      {props.practice && <p>Each condition begins with a practice round that does not count.</p>}
      {props.controls.map(({ technique, help, conditions }, i) => (
        <div key={i} className="card space-y-1" data-testid={`controls-${technique}`}>
          {props.controls.length > 1 && <h2 className="font-semibold">{TECHNIQUE_TITLES[technique]} <span className="font-normal">({conditions.join("; ")})</span></h2>}
          <p>{help.aim}</p>
          <p>To select, {help.select}.</p>
          {help.aimHold && <p>{help.aimHold}</p>}
          {help.pause && <p>{help.pause}</p>}
          {help.recenter && <p>{help.recenter}</p>}
        </div>
      ))}
      <button type="button" className="btn w-full sm:w-auto" onClick={props.onNext}>{props.practice ? "Start the practice" : "Start"}</button>
    </section>
  );
}

export function BreakStep(props: { seconds: number; onNext: () => void }) {
  const [left, setLeft] = useState(props.seconds);
  useEffect(() => {
    const started = Date.now();
    const id = setInterval(() => setLeft(Math.max(0, props.seconds - Math.floor((Date.now() - started) / 1000))), 250);
    return () => clearInterval(id);
  }, [props.seconds]);
  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">Break</h1>
      <p>Rest your hands and eyes. Put the device down if you like.</p>
      <p aria-live="polite">{left > 0 ? `You can continue in ${left} s.` : "You can continue when you are ready."}</p>
      <button type="button" className="btn w-full sm:w-auto" disabled={left > 0} onClick={props.onNext}>Continue</button>
    </section>
  );
}

type Answer = { itemId: string; valueInt: number | null; valueText: string | null };

export function ConditionQuestionnaire(props: { items: StudyDesign["perConditionItems"]; busy: boolean; onSubmit: (a: Answer[]) => void }) {
  const [values, setValues] = useState<Record<string, number>>({});
  const ready = props.items.every((i) => values[i.id] !== undefined);
  return (
    <form className="space-y-4" onSubmit={(e) => {
      e.preventDefault();
      if (ready) props.onSubmit(props.items.map((i) => ({ itemId: i.id, valueInt: values[i.id]!, valueText: null })));
    }}>
      <h1 className="text-xl font-semibold">About the condition you just finished</h1>
      {props.items.map((item) => (
        <fieldset key={item.id} className="space-y-1">
          <legend>{item.text}</legend>
          <div className="flex flex-wrap items-center gap-2 text-sm">
            <span>{item.lowLabel}</span>
            {Array.from({ length: item.points }, (_, k) => k + 1).map((v) => (
              <label key={v} className="flex flex-col items-center">
                <input type="radio" name={item.id} value={v} className="h-5 w-5" checked={values[item.id] === v} onChange={() => setValues({ ...values, [item.id]: v })} aria-label={`${item.text}: ${v} of ${item.points}`} />
                <span>{v}</span>
              </label>
            ))}
            <span>{item.highLabel}</span>
          </div>
        </fieldset>
      ))}
      <button type="submit" className="btn w-full sm:w-auto" disabled={!ready || props.busy}>Continue</button>
    </form>
  );
}

export function FinalQuestionnaire(props: { ask: StudyDesign["finalQuestionnaire"]; busy: boolean; onSubmit: (a: Answer[]) => void }) {
  const [age, setAge] = useState("");
  const [hand, setHand] = useState("");
  const [exp, setExp] = useState("");
  const [comments, setComments] = useState("");
  const ready = (!props.ask.ageBand || age) && (!props.ask.handedness || hand) && (!props.ask.experience || exp);
  const select = (label: string, value: string, set: (v: string) => void, options: string[]) => (
    <label className="block">{label}
      <select className="input w-full" value={value} onChange={(e) => set(e.target.value)}>
        <option value="">Choose…</option>
        {options.map((o) => <option key={o} value={o}>{o}</option>)}
      </select>
    </label>
  );
  return (
    <form className="space-y-3" onSubmit={(e) => {
      e.preventDefault();
      if (!ready) return;
      const a: Answer[] = [];
      if (props.ask.ageBand) a.push({ itemId: "age_band", valueInt: null, valueText: age });
      if (props.ask.handedness) a.push({ itemId: "handedness", valueInt: null, valueText: hand });
      if (props.ask.experience) a.push({ itemId: "experience", valueInt: null, valueText: exp });
      if (props.ask.comments && comments.trim()) a.push({ itemId: "comments", valueInt: null, valueText: comments.trim() });
      if (a.length === 0) a.push({ itemId: "none", valueInt: null, valueText: null });
      props.onSubmit(a);
    }}>
      <h1 className="text-xl font-semibold">A few last questions</h1>
      {props.ask.ageBand && select("Age", age, setAge, [...FINAL_CHOICES.age_band])}
      {props.ask.handedness && select("Which hand do you write with?", hand, setHand, [...FINAL_CHOICES.handedness])}
      {props.ask.experience && select("How often do you aim by moving a device (games, apps)?", exp, setExp, [...FINAL_CHOICES.experience])}
      {props.ask.comments && (
        <label className="block">Comments (optional)
          <textarea className="input w-full" rows={3} value={comments} onChange={(e) => setComments(e.target.value)} maxLength={MAX_COMMENT_CHARS} />
        </label>
      )}
      <button type="submit" className="btn w-full sm:w-auto" disabled={!ready || props.busy}>Finish</button>
    </form>
  );
}
