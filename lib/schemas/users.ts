import { z } from "zod";
import { roleSchema } from "@/lib/auth/roles";

/** Shared by the admin form (zodResolver) and the server. */
export const inviteUserSchema = z.object({
  email: z.email("Enter an e-mail address.").max(254),
  name: z.string().trim().min(1, "Enter a name.").max(120),
  role: roleSchema,
});
export type InviteUserInput = z.infer<typeof inviteUserSchema>;

export const updateUserSchema = z.object({ role: roleSchema, active: z.boolean() }).strict();
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const idParamSchema = z.object({ id: z.coerce.number().int().positive() });

export const resetRequestSchema = z.object({ email: z.email("Enter an e-mail address.").max(254) });
export const resetPasswordSchema = z
  .object({ token: z.string().min(20).max(200), password: z.string().min(10, "Use at least 10 characters.").max(200), confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });
