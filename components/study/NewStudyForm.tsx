"use client";

import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { createStudySchema } from "@/lib/schemas/studies";
import { Field } from "@/components/ui/Field";
import { apiSend, ApiError } from "./api";

type In = z.input<typeof createStudySchema>;
type Out = z.output<typeof createStudySchema>;

/** Creates a study (title, summary, protocol number) and opens it. */
export function NewStudyForm() {
  const router = useRouter();
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<In, unknown, Out>({ resolver: zodResolver(createStudySchema), defaultValues: { title: "", summary: "", protocolNumber: null } });
  const onSubmit = handleSubmit(async (values) => {
    try {
      const { study } = await apiSend<{ study: { id: number } }>("POST", "/api/studies", { ...values, protocolNumber: values.protocolNumber || null });
      router.push(`/studies/${study.id}/design`);
    } catch (e) {
      setError("root", { message: e instanceof ApiError ? e.message : String(e) });
    }
  });
  return (
    <form onSubmit={onSubmit} className="card max-w-xl space-y-3" noValidate>
      <h2>New study</h2>
      <Field id="new-title" label="Title" error={errors.title?.message}><input id="new-title" className="input" {...register("title")} /></Field>
      <Field id="new-summary" label="Summary"><textarea id="new-summary" className="input" rows={3} {...register("summary")} /></Field>
      <Field id="new-protocol" label="Ethics protocol number" hint="If the board has given one already."><input id="new-protocol" className="input" {...register("protocolNumber")} /></Field>
      {errors.root && <p className="field-error" role="alert">{errors.root.message}</p>}
      <button className="btn" disabled={isSubmitting}>Create study</button>
    </form>
  );
}
