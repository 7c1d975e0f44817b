"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { teamMemberSchema, updateStudySchema, type TeamMemberInput } from "@/lib/study/schemas";
import { Field } from "@/components/ui/Field";
import { apiSend, ApiError } from "./api";

type In = z.input<typeof updateStudySchema>;
type Out = z.output<typeof updateStudySchema>;

/** Title, summary and protocol number; after approval (inForceVersion) a changed title or summary waits for the amendment's approval. */
export function StudyMetaForm({ studyId, initial, inForceVersion = null }: { studyId: number; initial: { title: string; summary: string; protocolNumber: string | null }; inForceVersion?: number | null }) {
  const router = useRouter();
  const [ok, setOk] = useState(false);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<In, unknown, Out>({ resolver: zodResolver(updateStudySchema), defaultValues: { ...initial, protocolNumber: initial.protocolNumber ?? "" } });
  return (
    <form noValidate className="card max-w-xl space-y-3" onSubmit={handleSubmit(async (v) => {
      try {
        await apiSend("PATCH", `/api/studies/${studyId}`, { ...v, protocolNumber: v.protocolNumber ?? "" });
        setOk(true);
        router.refresh();
      } catch (e) {
        setError("root", { message: e instanceof ApiError ? e.message : String(e) });
      }
    })}>
      <h2>Study details</h2>
      <Field id="meta-title" label="Title" error={errors.title?.message}><input id="meta-title" className="input" {...register("title")} /></Field>
      <Field id="meta-summary" label="Summary" error={errors.summary?.message}><textarea id="meta-summary" className="input" rows={4} {...register("summary")} /></Field>
      <p className="text-xs text-slate-600">Title and summary are what participants read on the information page, so they are part of the protocol: after approval a change is an amendment (Review tab).</p>
      <Field id="meta-protocol" label="Ethics protocol number" error={errors.protocolNumber?.message}><input id="meta-protocol" className="input" {...register("protocolNumber")} /></Field>
      {errors.root && <p className="field-error" role="alert">{errors.root.message}</p>}
      {ok && <p className="notice" role="status">{inForceVersion === null ? "Saved." : `Saved. Participants keep reading the approved version ${inForceVersion} until a reviewer approves the amendment (Review tab).`}</p>}
      <button className="btn" disabled={isSubmitting}>Save details</button>
    </form>
  );
}

export function TeamForm({ studyId }: { studyId: number }) {
  const router = useRouter();
  const { register, handleSubmit, setError, reset, formState: { errors, isSubmitting } } = useForm<TeamMemberInput>({ resolver: zodResolver(teamMemberSchema), defaultValues: { email: "", role: "editor" } });
  return (
    <form noValidate className="flex flex-wrap items-end gap-2" onSubmit={handleSubmit(async (v) => {
      try {
        await apiSend("POST", `/api/studies/${studyId}/team`, v);
        reset();
        router.refresh();
      } catch (e) {
        setError("email", { message: e instanceof ApiError ? e.message : String(e) });
      }
    })}>
      <div><label htmlFor="team-email">Researcher's e-mail</label><input id="team-email" className="input w-72" {...register("email")} />{errors.email && <p className="field-error" role="alert">{errors.email.message}</p>}</div>
      <div><label htmlFor="team-role">Team role</label><select id="team-role" className="input" {...register("role")}><option value="editor">Editor</option><option value="viewer">Viewer</option></select></div>
      <button className="btn-secondary" disabled={isSubmitting}>Add to team</button>
    </form>
  );
}
