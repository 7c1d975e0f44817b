import { z } from "zod";

/** A consent text as the editor sends it (form and server). */
export const consentBodySchema = z.strictObject({
  body: z.string().max(100_000, "Keep the consent text under 100 000 characters.").refine((s) => s.trim().length >= 20, "Write at least a few sentences."),
  /** Days after the session within which a participant may ask for erasure, as the text states; null: no limit. */
  erasureWindowDays: z.number().int().min(1, "At least one day.").max(36_500).nullable().optional(),
});
export type ConsentBodyInput = z.infer<typeof consentBodySchema>;
