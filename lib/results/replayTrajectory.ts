import { gunzipSync } from "node:zlib";
import type { TransferConfig } from "../motion/config";
import { parseSampleCsv, sampleFromTable } from "../motion/csv";
import { createMotionEngine } from "../motion/engine";
import type { MotionSample } from "../motion/sample";

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
 * stream (gzip of the replay CSV of interfaces.md) and the same engine the session ran, starting
 * at the sequence's first target centre. Also measures the stream's rate and gaps.
 * Cost: O(samples).
 * @throws SampleCsvError for a malformed stream; Error from zlib for a damaged gzip.
 * @example replayTrajectory(gz, config, { x: 0, y: -150 }).sampleRateHz // 60.1
 */
export function replayTrajectory(streamGz: Buffer, config: TransferConfig, start: { x: number; y: number }, maxPoints = 800, file = "stream.csv"): Trajectory {
  const table = parseSampleCsv(gunzipSync(streamGz).toString("utf8"), file);
  const engine = createMotionEngine(config);
  engine.setPosition(start.x, start.y); // absolute touch positions (pointer_x/y) are in these coordinates
  const n = table.length;
  const step = Math.max(1, Math.ceil(n / maxPoints));
  const sample: MotionSample = { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 };
  const points: Trajectory["points"] = [];
  let x = start.x, y = start.y, maxGap = 0;
  const t0 = n > 0 ? (table.columns.t_ms[0] as number) : 0;
  for (let i = 0; i < n; i++) {
    sampleFromTable(table, i, sample);
    if (i > 0) maxGap = Math.max(maxGap, sample.tMs - (table.columns.t_ms[i - 1] as number));
    const o = engine.push(sample);
    if (o) {
      x += o.dx;
      y += o.dy;
    }
    if (i % step === 0 || i === n - 1) points.push({ t: sample.tMs - t0, x, y });
  }
  const durationMs = n > 1 ? (table.columns.t_ms[n - 1] as number) - t0 : 0;
  return { points, samples: n, dropped: engine.dropped, sampleRateHz: durationMs > 0 ? ((n - 1) * 1000) / durationMs : 0, maxGapMs: maxGap, durationMs };
}
