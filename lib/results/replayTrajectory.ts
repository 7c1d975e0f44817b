import { gunzipSync } from "node:zlib";
import type { TransferConfig } from "../motion/config";
import { parseSampleCsv } from "../motion/csv";
import type { Point } from "../task/point";
import { replayPositions, type ReplaySetup } from "./replayPositions";

export interface Trajectory {
  /** Cursor (or view) positions in the task's unit, thinned to at most maxPoints; t in ms from the stream's first sample. */
  points: { t: number; x: number; y: number }[];
  samples: number;
  /** Samples the engine refused (invalid values, time going backwards). */
  dropped: number;
  /** Mean sample rate over the stream, Hz. */
  sampleRateHz: number;
  /** Longest interval between successive samples, ms. */
  maxGapMs: number;
  durationMs: number;
}

/**
 * Replays a stored raw stream through the condition's transfer function (replayTrajectory).
 *
 * Purpose: the per-participant page draws what the participant's cursor did, from the raw sensor
 * stream (gzip of the replay CSV of interfaces.md) and the same engine the session ran
 * (replayPositions), starting at the sequence's first target centre. Also measures the stream's
 * rate and gaps.
 * Cost: O(samples).
 * @throws SampleCsvError for a malformed stream; Error from zlib for a damaged gzip.
 * @example replayTrajectory(gz, config, { displayMode: "cursor", pixelsPerUnit: 1 }, { x: 0, y: -150 }).sampleRateHz // 60.1
 */
export function replayTrajectory(streamGz: Buffer, config: TransferConfig, setup: ReplaySetup, start: Point, maxPoints = 800, file = "stream.csv"): Trajectory {
  const table = parseSampleCsv(gunzipSync(streamGz).toString("utf8"), file);
  const r = replayPositions(table, config, setup, start);
  const n = table.length;
  const step = Math.max(1, Math.ceil(n / maxPoints));
  const t0 = n > 0 ? r.t[0]! : 0;
  const points: Trajectory["points"] = [];
  for (let i = 0; i < n; i++) if (i % step === 0 || i === n - 1) points.push({ t: r.t[i]! - t0, x: r.x[i]!, y: r.y[i]! });
  const durationMs = n > 1 ? r.t[n - 1]! - t0 : 0;
  return { points, samples: n, dropped: r.dropped, sampleRateHz: durationMs > 0 ? ((n - 1) * 1000) / durationMs : 0, maxGapMs: r.maxGapMs, durationMs };
}
