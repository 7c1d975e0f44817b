"use server";

import { consumePasswordToken } from "@/lib/accounts/password-tokens";
import { headers } from "next/headers";
import { startPasswordReset } from "@/lib/accounts/users";
import { clientAddress } from "@/lib/auth/rate-limit";
import { db } from "@/lib/db";
import { resetPasswordSchema, resetRequestSchema } from "@/lib/schemas/users";

/** The one answer to every reset request. */
const RESET_REQUESTED = "If an account uses this address, a link to reset its password is on its way. It works for one hour. (At most three links an hour are sent.)";

export type FormState = { ok?: boolean; message?: string; errors?: Record<string, string[] | undefined> };

export async function requestResetAction(_prev: FormState, form: FormData): Promise<FormState> {
  const parsed = resetRequestSchema.safeParse({ email: form.get("email") });
  if (!parsed.success) return { errors: { email: ["Enter an e-mail address."] } };
  // The same words, after the same work, whether or not the account exists (startPasswordReset).
  await startPasswordReset(db, parsed.data.email, clientAddress(await headers()));
  return { ok: true, message: RESET_REQUESTED };
}

export async function setPasswordAction(_prev: FormState, form: FormData): Promise<FormState> {
  const parsed = resetPasswordSchema.safeParse({ token: form.get("token"), password: form.get("password"), confirm: form.get("confirm") });
  if (!parsed.success) {
    const errors: Record<string, string[]> = {};
    for (const i of parsed.error.issues) (errors[String(i.path[0])] ??= []).push(i.message);
    return { errors };
  }
  const userId = await consumePasswordToken(db, parsed.data.token, parsed.data.password);
  if (userId === null) return { message: "This link has expired or has been used already. Ask for a new one." };
  return { ok: true, message: "Your password is set. You can sign in now." };
}
