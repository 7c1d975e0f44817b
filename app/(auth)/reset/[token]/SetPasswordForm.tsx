"use client";

import Link from "next/link";
import { useActionState } from "react";
import { Field } from "@/components/ui/Field";
import { setPasswordAction, type FormState } from "../actions";

export function SetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(setPasswordAction, {});
  if (state.ok) {
    return (
      <p role="status" className="text-sm">
        {state.message} <Link href="/signin">Sign in</Link>
      </p>
    );
  }
  return (
    <form action={action} className="space-y-4">
      <input type="hidden" name="token" value={token} />
      <Field id="password" label="New password" hint="At least 10 characters." error={state.errors?.password?.[0]}>
        <input id="password" name="password" type="password" autoComplete="new-password" className="input" required />
      </Field>
      <Field id="confirm" label="The same again" error={state.errors?.confirm?.[0]}>
        <input id="confirm" name="confirm" type="password" autoComplete="new-password" className="input" required />
      </Field>
      {state.message && <p className="field-error" role="alert">{state.message}</p>}
      <button type="submit" className="btn" disabled={pending}>Set password</button>
    </form>
  );
}
