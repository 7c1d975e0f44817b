import { z } from "zod";

export const createStudySchema = z.object({
  title: z.string().trim().min(3, "Give the study a title of at least 3 characters.").max(200),
  summary: z.string().trim().max(5000).default(""),
  protocolNumber: z.string().trim().max(64).nullable().default(null),
});
export type CreateStudyInput = z.input<typeof createStudySchema>;
