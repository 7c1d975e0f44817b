"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Field } from "@/components/ui/Field";

const schema = z.object({ email: z.email("Enter your e-mail address."), password: z.string().min(1, "Enter your password.") });

export function SignInForm() {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm({ resolver: zodResolver(schema) });

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await signIn("credentials", { ...values, redirect: false });
    if (res?.status === 429) return setMessage("Too many failed sign-ins for this account. Wait 15 minutes or reset your password.");
    if (!res?.ok) return setMessage("The e-mail address or the password is wrong.");
    router.replace("/");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <Field id="email" label="E-mail" error={formState.errors.email?.message}>
        <input id="email" type="email" autoComplete="username" className="input" {...register("email")} />
      </Field>
      <Field id="password" label="Password" error={formState.errors.password?.message}>
        <input id="password" type="password" autoComplete="current-password" className="input" {...register("password")} />
      </Field>
      {message && <p className="field-error" role="alert">{message}</p>}
      <div className="flex items-center justify-between">
        <button type="submit" className="btn" disabled={formState.isSubmitting}>Sign in</button>
        <Link href="/reset" className="text-sm">Forgot your password?</Link>
      </div>
    </form>
  );
}
