"use server";

import { consumePasswordToken } from "@/lib/accounts/password-tokens";
import { requestPasswordReset } from "@/lib/accounts/users";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { resetPasswordSchema, resetRequestSchema } from "@/lib/schemas/users";

export type FormState = { ok?: boolean; message?: string; errors?: Record<string, string[] | undefined> };

export async function requestResetAction(_prev: FormState, form: FormData): Promise<FormState> {
  const parsed = resetRequestSchema.safeParse({ email: form.get("email") });
  if (!parsed.success) return { errors: { email: ["Enter an e-mail address."] } };
  try {
    await requestPasswordReset(db, parsed.data.email);
  } catch (e) {
    console.error(e);
    return { message: "The message could not be sent. Try again in a minute." };
  }
  return { ok: true, message: "If an account uses this address, a link to reset its password is on its way. It works for one hour." };
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
  await appendAudit(db, { actorUserId: userId, actorLabel: `user ${userId}`, action: "user.password_set", details: {} });
  return { ok: true, message: "Your password is set. You can sign in now." };
}
