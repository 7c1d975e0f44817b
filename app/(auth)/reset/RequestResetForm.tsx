"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/Field";
import { requestResetAction, type FormState } from "./actions";

export function RequestResetForm() {
  const [state, action, pending] = useActionState<FormState, FormData>(requestResetAction, {});
  return (
    <form action={action} className="space-y-4">
      <Field id="email" label="E-mail" error={state.errors?.email?.[0]}>
        <input id="email" name="email" type="email" required autoComplete="username" className="input" />
      </Field>
      {state.message && <p role="status" className={state.ok ? "text-sm text-accent-strong" : "field-error"}>{state.message}</p>}
      <button type="submit" className="btn" disabled={pending}>Send the link</button>
    </form>
  );
}
