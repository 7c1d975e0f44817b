import { z } from "zod";

/** A consent text as the editor sends it (form and server). */
export const consentBodySchema = z.strictObject({
  body: z.string().max(100_000, "Keep the consent text under 100 000 characters.").refine((s) => s.trim().length >= 20, "Write at least a few sentences."),
});
export type ConsentBodyInput = z.infer<typeof consentBodySchema>;
