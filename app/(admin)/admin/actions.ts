"use server";

import { revalidatePath } from "next/cache";
import { changeUser, inviteUser } from "@/lib/accounts/users";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { inviteUserSchema, updateUserSchema, type InviteUserInput } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

export type ActionResult = { ok: boolean; message: string; errors?: Record<string, string> };

function failure(e: unknown): ActionResult {
  if (e instanceof AppError) return { ok: false, message: e.message };
  console.error(e);
  return { ok: false, message: "The change could not be saved." };
}

export async function inviteUserAction(input: InviteUserInput): Promise<ActionResult> {
  const actor = requireRole(await getCurrentUser(), "admin");
  const parsed = inviteUserSchema.safeParse(input);
  if (!parsed.success) {
    return { ok: false, message: "Check the fields.", errors: Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])) };
  }
  try {
    const user = await inviteUser(db, actor, parsed.data);
    revalidatePath("/admin");
    return { ok: true, message: `Invitation sent to ${user.email}.` };
  } catch (e) {
    return failure(e);
  }
}

export async function changeUserAction(_prev: ActionResult | null, form: FormData): Promise<ActionResult> {
  const actor = requireRole(await getCurrentUser(), "admin");
  const parsed = updateUserSchema.safeParse({ role: form.get("role"), active: form.get("active") === "on" });
  const id = Number(form.get("id"));
  if (!parsed.success || !Number.isInteger(id)) return { ok: false, message: "Choose a role." };
  try {
    await changeUser(db, actor, id, parsed.data);
    revalidatePath("/admin");
    return { ok: true, message: "Saved." };
  } catch (e) {
    return failure(e);
  }
}
