import type { SequenceBatch } from "./batch";
import type { Problem } from "./plausibility";

/** What decompressing a stream found (lib/ingest/inspectStream.ts): its samples' count and times. */
export interface StreamFacts {
  /** Data lines (samples). */
  samples: number;
  /** t_ms of the first and the last sample in file order (the runner's rate uses these). */
  firstMs: number;
  lastMs: number;
  /** The earliest and the latest t_ms anywhere in the stream. */
  minMs: number;
  maxMs: number;
}

/** The highest sample rate a browser source delivers, Hz (pointer events of fast mice reach 1000 Hz; common practice). */
export const MAX_SAMPLE_RATE_HZ = 2000;

/**
 * Why a stream does not fit its sequence's movements, or an empty list (streamProblems).
 *
 * Purpose: the raw stream is what the movements were made with, so it must cover them:
 * - `samples`: as many samples as `sampleCount` says;
 * - `stream-span`: from the earliest to the latest sample at least the movements' total time,
 *   less one second or a tenth (a selection by key or tap may come a sample period after the
 *   last sample; a short stall of the sensor at the end is no forgery);
 * - `sample-rate`: the declared rate is the one the runner computes from these samples,
 *   1000·(n − 1)/(t_last − t_first) rounded to 0.1 Hz (0 below 3 samples), and no faster than
 *   MAX_SAMPLE_RATE_HZ.
 * Source: the runner's own definitions (lib/runner/sequenceRecorder.ts, TaskCanvas's quality
 * figures: lib/motion/calibration/sampleRateReport.ts). Cost: O(n movements).
 * @throws never.
 * @example streamProblems(batch, { samples: 600, firstMs: 0, lastMs: 9985, minMs: 0, maxMs: 9985 }) // []
 */
export function streamProblems(batch: SequenceBatch, facts: StreamFacts): Problem[] {
  const problems: Problem[] = [];
  if (facts.samples !== batch.stream.sampleCount) problems.push({ rule: "samples", message: `the stream has ${facts.samples} samples, but sampleCount says ${batch.stream.sampleCount}` });
  const total = batch.movements.reduce((a, m) => a + m.time_ms, 0);
  const span = facts.samples > 0 ? facts.maxMs - facts.minMs : 0;
  const allowance = Math.max(1000, 0.1 * total);
  if (span < total - allowance) {
    problems.push({ rule: "stream-span", message: `the stream spans ${Math.round(span)} ms, but the movements took ${Math.round(total)} ms` });
  }
  const declared = batch.quality.sampleRateHz;
  const duration = facts.lastMs - facts.firstMs;
  const expected = facts.samples >= 3 && duration > 0 ? (1000 * (facts.samples - 1)) / duration : 0;
  if (Math.abs(declared - expected) > 0.05 + 1e-6 * expected) {
    problems.push({ rule: "sample-rate", message: `sampleRateHz says ${declared}, but ${facts.samples} samples over ${Math.round(duration)} ms are ${Math.round(expected * 10) / 10} Hz` });
  }
  if (expected > MAX_SAMPLE_RATE_HZ) problems.push({ rule: "sample-rate", message: `${Math.round(expected)} samples per second is faster than any browser source (${MAX_SAMPLE_RATE_HZ} Hz)` });
  return problems;
}
