"use client";

import { useState } from "react";
import type { TransferConfig } from "@/lib/motion/config";
import type { StudyDesign } from "@/lib/study/design";
import { ShortLinkCard, type ShortLinkView } from "@/components/links/ShortLinkCard";
import { apiSend } from "../api";

type Answer = { path: string; expiresAt: string; link: ShortLinkView };

/** "Try this level": the runner's task at a condition's settings, here or on a phone (short link and QR code, one hour). */
export function TryPanel({ studyId, design, conditions }: { studyId: number; design: StudyDesign; conditions: { label: string; config: TransferConfig }[] }) {
  const [chosen, setChosen] = useState(0);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const c = conditions[Math.min(chosen, conditions.length - 1)];
  if (!c) return null;
  const open = async () => {
    setError(null);
    try {
      const t = design.task;
      setAnswer(await apiSend<Answer>("POST", `/api/studies/${studyId}/try`, {
        label: c.label, config: c.config,
        task: { type: t.type, displayMode: t.displayMode, unit: t.unit, targetsPerRing: t.targetsPerRing, amplitudes: t.amplitudes, widths: t.widths, selection: t.selection, dwellMs: t.dwellMs, trialTimeLimitMs: t.trialTimeLimitMs },
      }));
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };
  return (
    <section className="card space-y-2 text-sm" aria-labelledby="try-title">
      <h3 id="try-title" className="text-base font-semibold">Feel each level</h3>
      <p>Open the study&apos;s own task at one condition&apos;s settings: on this computer with a mouse or a controller, or on a phone through the short link. Nothing is recorded (no consent, no participant); the link works for an hour. The settings are those on this page, saved or not.</p>
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex items-center gap-2">Condition
          <select className="input w-auto" aria-label="Condition to try" value={chosen} onChange={(e) => { setChosen(Number(e.target.value)); setAnswer(null); }}>
            {conditions.map((x, i) => <option key={x.label} value={i}>{x.label}</option>)}
          </select>
        </label>
        <button type="button" className="btn-secondary" onClick={() => void open()}>Try this level</button>
      </div>
      {error && <p className="field-error" role="alert">{error}</p>}
      {answer && (
        <div className="space-y-2">
          <p><a href={answer.path} target="_blank" rel="noopener" className="font-semibold">Open it on this computer</a> (a new tab).</p>
          <ShortLinkCard link={answer.link} title={`On a phone: ${c.label}`} note="The phone opens the same task with its own motion sensors." />
        </div>
      )}
    </section>
  );
}
