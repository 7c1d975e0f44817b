import type { TransferConfig } from "../motion/config";
import { parseSampleCsv } from "../motion/csv";
import { replayPositions, type ReplaySetup } from "./replayPositions";
import { sequencePathMeasures, type PathOptions, type RecordedMovement, type SequencePaths } from "./sequencePathMeasures";
import type { TrialRecord } from "./trialRecord";

/** Version of the path method: part of every cached result's inputs, so a change to it recomputes them. */
export const PATH_METHOD_VERSION = 1;

/** A sequence's stored movements as sequencePathMeasures reads them. */
export function pathMovementsOf(records: readonly TrialRecord[]): RecordedMovement[] {
  return records.map((r) => ({
    trial: Number(r.trial),
    from: { x: Number(r.from_x), y: Number(r.from_y) },
    to: { x: Number(r.to_x), y: Number(r.to_y) },
    start: { x: Number(r.start_x), y: Number(r.start_y) },
    end: { x: Number(r.end_x), y: Number(r.end_y) },
    timeMs: Number(r.time_ms),
    width: Number(r.width),
  }));
}

/**
 * Path accuracy of one recorded sequence from its raw stream (streamPaths): parses the replay CSV,
 * replays it through the condition's configuration from the first target (replayPositions) and
 * measures each movement (sequencePathMeasures). Shared by the results page and `analyze --archive`.
 * Cost: O(samples + movements · log samples).
 * @throws never: an unreadable stream comes back as not computable, with the reason.
 * @example streamPaths(csv, config, { displayMode: "cursor", pixelsPerUnit: 1 }, movements, { geometry: "plane", task: "ring" }).ok // true
 */
export function streamPaths(streamCsv: string, config: TransferConfig, setup: ReplaySetup, movements: readonly RecordedMovement[], options: PathOptions, file = "stream.csv"): SequencePaths {
  const first = [...movements].sort((a, b) => a.trial - b.trial)[0];
  if (!first) return { ok: false, reason: "no movements recorded for the stream", residual: null };
  let table;
  try {
    table = parseSampleCsv(streamCsv, file);
  } catch (e) {
    return { ok: false, reason: `the raw stream could not be read: ${(e as Error).message}`, residual: null };
  }
  return sequencePathMeasures(replayPositions(table, config, setup, first.from), movements, options);
}
