import type { AnalysisOptionsInput } from "../options";
import type { SequenceInfo } from "../sequenceInfo";
import type { ParticipantGroup } from "../trialAccumulator";

export interface ChunkJob {
  path: string;
  start: number;
  end: number;
  /** Header fields for every chunk but the first (which reads its own). */
  header?: string[];
  options: AnalysisOptionsInput;
}

/** What a worker read: the accumulator's contents as plain data (typed arrays are transferred). */
export interface ChunkData {
  sequences: SequenceInfo[];
  participants: [string, ParticipantGroup][];
  factorOrder: string[] | undefined;
  length: number;
  columns: { seq: Int32Array; trial: Int32Array; line: Int32Array; dx: Float64Array; distance: Float64Array; endError: Float64Array; timeMs: Float64Array; hit: Uint8Array; flags: Uint8Array };
}

export type ChunkReply =
  | { ok: true; data: ChunkData; lines: number; sawQuote: boolean }
  | { ok: false; line: number; column: string; detail: string; sawQuote: boolean };
