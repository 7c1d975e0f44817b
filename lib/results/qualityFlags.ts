/** One data-quality flag of a sequence, in words. */
export interface QualityFlag {
  level: "warning" | "note";
  text: string;
}

/** Thresholds for the flags; the defaults are the project's own choices, shown on the page. */
export interface QualityThresholds {
  minSampleRateHz: number;
  maxGapMs: number;
  maxErrorRate: number;
}

/**
 * Whether a technique's input reports only when the person acts (isEventDriven): a mouse and a
 * touch screen send events when the pointer moves or a finger touches (W3C Pointer Events and UI
 * Events define events on change, with no sampling rate), so a stream's rate and gaps say nothing
 * about its quality. Motion sensors and a polled gamepad report at a rate of their own.
 * @example isEventDriven("touch") // true
 */
export function isEventDriven(technique: string): boolean {
  return technique === "touch" || technique === "mouse";
}

/**
 * Data-quality flags of one sequence (qualityFlags): a slow or gappy sensor stream, samples the
 * engine refused, a missing stream, misfires removed, an error rate far above the usual few
 * per cent (ISO 9241-411 studies aim near 4 %: common practice), too few movements kept.
 * The rate and gap limits are left out for event-driven input (eventDriven, see isEventDriven).
 * Cost: O(1).
 * @throws never.
 * @example qualityFlags({ sampleRateHz: 31, maxGapMs: 40, dropped: 0, hasStream: true, errorRate: 0.05, excluded: 0, kept: 12 }, { minSampleRateHz: 50, maxGapMs: 100, maxErrorRate: 0.25 })[0].text // "sensor rate 31 Hz is below the study's minimum of 50 Hz"
 */
export function qualityFlags(
  s: { sampleRateHz: number | null; maxGapMs: number | null; dropped: number; hasStream: boolean; errorRate: number | null; excluded: number; kept: number | null; eventDriven?: boolean },
  limits: QualityThresholds,
): QualityFlag[] {
  const flags: QualityFlag[] = [];
  if (!s.hasStream) flags.push({ level: "note", text: "no raw stream stored for this sequence" });
  if (!s.eventDriven && s.sampleRateHz !== null && s.sampleRateHz > 0 && s.sampleRateHz < limits.minSampleRateHz) {
    flags.push({ level: "warning", text: `sensor rate ${Math.round(s.sampleRateHz)} Hz is below the study's minimum of ${limits.minSampleRateHz} Hz` });
  }
  if (!s.eventDriven && s.maxGapMs !== null && s.maxGapMs > limits.maxGapMs) flags.push({ level: "warning", text: `a gap of ${Math.round(s.maxGapMs)} ms between samples (limit ${limits.maxGapMs} ms)` });
  if (s.dropped > 0) flags.push({ level: "warning", text: `${s.dropped} invalid sample(s) refused by the engine` });
  if (s.excluded > 0) flags.push({ level: "note", text: `${s.excluded} misfire(s) removed by the exclusion rule` });
  if (s.errorRate !== null && s.errorRate > limits.maxErrorRate) flags.push({ level: "warning", text: `error rate ${Math.round(s.errorRate * 100)} % is above ${Math.round(limits.maxErrorRate * 100)} %` });
  if (s.kept !== null && s.kept < 2) flags.push({ level: "warning", text: "fewer than 2 movements kept: the sequence is left out of the analysis" });
  return flags;
}
