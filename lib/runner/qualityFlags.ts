/** Limits the live monitor flags against (common practice; adjustable in one place). */
export const QUALITY_LIMITS = {
  /** Gyroscope bias magnitude above which calibration looks unreliable, deg/s. */
  maxBiasDegPerS: 1,
  /** Error rate (fraction of misses) above which a session is flagged. */
  maxErrorRate: 0.2,
  /** No activity for this long while in progress, ms. */
  idleMs: 5 * 60_000,
} as const;

export interface SessionFigures {
  status: string;
  sampleRateHz: number | null;
  minSampleRateHz: number;
  biasDegPerS: number | null;
  errorRate: number | null;
  lastActivityMs: number | null;
  nowMs: number;
}

/**
 * Data-quality flags of one session, in words (qualityFlags).
 *
 * Purpose: the live monitor's warnings: sensor rate below the study's minimum, large gyroscope
 * bias, error rate above the limit, long idle while in progress. Source: the study's
 * minSampleRateHz; limits above (common practice). Cost: O(1).
 * @throws never.
 * @example qualityFlags({ status: "in_progress", sampleRateHz: 30, minSampleRateHz: 50, biasDegPerS: 0.2, errorRate: 0.05, lastActivityMs: 0, nowMs: 1000 }) // ["sensor rate 30 Hz, below 50 Hz"]
 */
export function qualityFlags(f: SessionFigures): string[] {
  const flags: string[] = [];
  if (f.sampleRateHz !== null && f.sampleRateHz < f.minSampleRateHz) flags.push(`sensor rate ${Math.round(f.sampleRateHz)} Hz, below ${f.minSampleRateHz} Hz`);
  if (f.biasDegPerS !== null && f.biasDegPerS > QUALITY_LIMITS.maxBiasDegPerS) flags.push(`large gyroscope bias ${f.biasDegPerS.toFixed(2)} deg/s`);
  if (f.errorRate !== null && f.errorRate > QUALITY_LIMITS.maxErrorRate) flags.push(`error rate ${(100 * f.errorRate).toFixed(0)} %, above ${100 * QUALITY_LIMITS.maxErrorRate} %`);
  const active = f.status === "consented" || f.status === "in_progress";
  if (active && f.lastActivityMs !== null && f.nowMs - f.lastActivityMs > QUALITY_LIMITS.idleMs) flags.push(`idle for ${Math.round((f.nowMs - f.lastActivityMs) / 60_000)} min`);
  return flags;
}
