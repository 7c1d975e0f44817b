import { median, quantile, sampleStandardDeviation } from "simple-statistics";

/** Sample-rate and jitter report for a device check. Intervals in ms, rate in Hz. */
export interface SampleRateReport {
  n: number;
  durationMs: number;
  meanRateHz: number;
  medianIntervalMs: number;
  /** Sample SD of the intervals (n − 1): the timing jitter. */
  jitterSdMs: number;
  p05IntervalMs: number;
  p95IntervalMs: number;
  maxIntervalMs: number;
  /** Intervals longer than 3 × the median (dropped or late samples). */
  gaps: number;
}

/**
 * Sample-rate and jitter report (sampleRateReport).
 *
 * Purpose: the device check reports which rate a sensor really delivers (DeviceMotion ≈ 60 Hz;
 * controllers higher) and how uneven its time stamps are. Source: science.md §7 (use
 * `event.timeStamp` for Δt); quantiles and SD from simple-statistics. Cost: O(n log n).
 * @throws Error "sampleRateReport requires at least 3 time stamps".
 * @example sampleRateReport([0, 10, 20, 30, 40]).meanRateHz // 100
 */
export function sampleRateReport(timesMs: readonly number[]): SampleRateReport {
  if (timesMs.length < 3) throw new Error("sampleRateReport requires at least 3 time stamps");
  const intervals: number[] = [];
  for (let i = 1; i < timesMs.length; i++) intervals.push((timesMs[i] as number) - (timesMs[i - 1] as number));
  const med = median(intervals);
  const durationMs = (timesMs[timesMs.length - 1] as number) - (timesMs[0] as number);
  return {
    n: timesMs.length,
    durationMs,
    meanRateHz: durationMs > 0 ? (1000 * intervals.length) / durationMs : 0,
    medianIntervalMs: med,
    jitterSdMs: sampleStandardDeviation(intervals),
    p05IntervalMs: quantile(intervals, 0.05),
    p95IntervalMs: quantile(intervals, 0.95),
    maxIntervalMs: Math.max(...intervals),
    gaps: intervals.filter((d) => d > 3 * med).length,
  };
}
