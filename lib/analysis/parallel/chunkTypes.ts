import type { AnalysisOptionsInput } from "../options";
import type { SequenceState } from "../sequenceState";

export interface ChunkJob {
  path: string;
  start: number;
  end: number;
  /** Header fields for every chunk but the first (which reads its own). */
  header?: string[];
  options: AnalysisOptionsInput;
}

export type ChunkReply =
  | { ok: true; states: SequenceState[]; lines: number; sawQuote: boolean }
  | { ok: false; line: number; column: string; detail: string; sawQuote: boolean };
