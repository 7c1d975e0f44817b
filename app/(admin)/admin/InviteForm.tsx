"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field } from "@/components/ui/Field";
import { ROLES } from "@/lib/auth/roles";
import { inviteUserSchema } from "@/lib/schemas/users";
import { inviteUserAction, type ActionResult } from "./actions";

export function InviteForm() {
  const [result, setResult] = useState<ActionResult | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm({ resolver: zodResolver(inviteUserSchema), defaultValues: { role: "researcher" as const } });
  const onSubmit = handleSubmit(async (values) => {
    const r = await inviteUserAction(values);
    setResult(r);
    if (r.ok) reset();
    for (const [field, message] of Object.entries(r.errors ?? {})) setError(field as "email", { message });
  });
  return (
    <form onSubmit={onSubmit} className="grid gap-3 sm:grid-cols-[1fr_1fr_auto_auto] sm:items-end" noValidate>
      <Field id="invite-name" label="Name" error={formState.errors.name?.message}>
        <input id="invite-name" className="input" {...register("name")} />
      </Field>
      <Field id="invite-email" label="E-mail" error={formState.errors.email?.message}>
        <input id="invite-email" type="email" className="input" {...register("email")} />
      </Field>
      <Field id="invite-role" label="Role" error={formState.errors.role?.message}>
        <select id="invite-role" className="input" {...register("role")}>
          {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
        </select>
      </Field>
      <button type="submit" className="btn" disabled={formState.isSubmitting}>Invite</button>
      {result && <p role="status" className={`sm:col-span-4 text-sm ${result.ok ? "text-accent-strong" : "field-error"}`}>{result.message}</p>}
    </form>
  );
}
