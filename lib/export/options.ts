import { z } from "zod";

/**
 * The researcher's choices for one anonymised archive. Defaults are the cautious ones: random
 * pseudonyms, no dates, no free text, no raw streams.
 */
export const exportOptionsSchema = z.strictObject({
  /** "random": new pseudonyms per archive; "stable": the same pseudonym in every archive of the study (keyed hash). */
  pseudonyms: z.enum(["random", "stable"]).default("random"),
  /** Add streams/: one gzip replay CSV per sequence. */
  includeStreams: z.boolean().default(false),
  /** Calendar dates instead of times relative to each participant's session start. */
  includeDates: z.boolean().default(false),
  /** Free-text answers (they may name people or places: read them first). */
  includeFreeText: z.boolean().default(false),
});

export type ExportOptions = z.output<typeof exportOptionsSchema>;
export type ExportOptionsInput = z.input<typeof exportOptionsSchema>;
