"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { consentBodySchema, type ConsentBodyInput } from "@/lib/consent/schema";
import { consentChecklist } from "@/lib/consent/consentChecklist";
import { ConsentChecklistView } from "./ConsentChecklistView";
import { ConsentMarkdown } from "./ConsentMarkdown";
import { apiSend, ApiError } from "./api";

/** Writes the consent text (Markdown) with a live preview and the checklist; saving edits the draft or starts a new version. */
export function ConsentEditor({ studyId, initial, note, erasureWindowDays }: { studyId: number; initial: string; note: string; erasureWindowDays: number | null }) {
  const router = useRouter();
  const [status, setStatus] = useState<string | null>(null);
  const [windowDays, setWindowDays] = useState(erasureWindowDays === null ? "" : String(erasureWindowDays));
  const { register, handleSubmit, watch, setError, formState: { errors, isSubmitting } } = useForm<ConsentBodyInput>({ resolver: zodResolver(consentBodySchema), defaultValues: { body: initial } });
  const body = watch("body");
  const onSubmit = handleSubmit(async (v) => {
    try {
      const days = windowDays.trim() === "" ? null : Number(windowDays);
      const r = await apiSend<{ version: { version: number } }>("POST", `/api/studies/${studyId}/consent`, { ...v, erasureWindowDays: days });
      setStatus(`Saved as version ${r.version.version} (draft).`);
      router.refresh();
    } catch (e) {
      setError("body", { message: e instanceof ApiError ? e.message : String(e) });
    }
  });
  return (
    <form onSubmit={onSubmit} className="grid gap-4 lg:grid-cols-2" noValidate>
      <div className="space-y-2">
        <label htmlFor="consent-body">Consent text (Markdown)</label>
        <p className="text-xs text-slate-600">{note}</p>
        <textarea id="consent-body" className="input font-mono text-xs" rows={24} {...register("body")} aria-describedby={errors.body ? "consent-error" : undefined} />
        {errors.body && <p id="consent-error" className="field-error" role="alert">{errors.body.message}</p>}
        <label htmlFor="erasure-window" className="block">Participants may ask for erasure up to this many days after their session (empty: at any time)</label>
        <input id="erasure-window" className="input w-32" inputMode="numeric" value={windowDays} onChange={(e) => setWindowDays(e.target.value)} />
        <p className="text-xs text-slate-600">State the same window in the text. Participants see their code on every screen and in their consent copy; the owner erases by that code (Participants page).</p>
        {status && <p className="notice" role="status">{status}</p>}
        <button className="btn" disabled={isSubmitting}>Save consent text</button>
        <ConsentChecklistView items={consentChecklist(body ?? "")} />
      </div>
      <div className="card space-y-2" aria-label="Preview">
        <h2>Preview</h2>
        <ConsentMarkdown text={body ?? ""} />
      </div>
    </form>
  );
}
