import { TrialAccumulator } from "../analysis/trialAccumulator";
import { sequenceSummaries } from "../analysis/buildResult";
import { analysisOptionsSchema } from "../analysis/options";
import type { SequenceSummary } from "../analysis/result";
import type { TransferConfig } from "../motion/config";
import { conditionConfig, conditionsOf, type StudyDesign } from "../study/design";
import { analysisUnitOf, geometryOf } from "./analysisUnit";
import { replaySetupFor, type ParticipantCalibration } from "./participantCalibration";
import { isEventDriven, qualityFlags, type QualityFlag } from "./qualityFlags";
import { replayTrajectory, type Trajectory } from "./replayTrajectory";
import { trialRowFromRecord, type TrialRecord } from "./trialRecord";

export interface ParticipantStream {
  id: number;
  condition: string;
  conditionIndex: number;
  block: number;
  sequence: number;
  practice: boolean;
  sampleCount: number;
  quality: unknown;
}

export interface ParticipantSequenceView {
  condition: string;
  block: number;
  sequence: number;
  summary: SequenceSummary | null;
  streamId: number | null;
  sampleRateHz: number | null;
  maxGapMs: number | null;
  flags: QualityFlag[];
}

export interface ParticipantView {
  unit: "px" | "mm" | "deg";
  sequences: ParticipantSequenceView[];
  /** The chosen stream's replayed path, with the sequence's targets and selections. */
  trajectory: (Trajectory & { streamId: number; condition: string; block: number; sequence: number; practice: boolean; targets: { x: number; y: number }[]; selections: { x: number; y: number; hit: boolean }[]; width: number }) | null;
  thresholds: { minSampleRateHz: number; maxGapMs: number; maxErrorRate: number };
}

/** Error rate above which a sequence is flagged (our own threshold; ISO studies aim near 4 %: common practice). */
const MAX_ERROR_RATE = 0.25;

/**
 * One participant's sequences with data-quality flags, and the trajectory of one sequence
 * replayed from its raw stream (participantView).
 * Cost: O(movements + samples of every stream) (each stream is decoded once for its rate and gaps).
 * @throws never for bad streams (they are flagged); TrialTableError for inconsistent movements.
 * @example participantView(design, "P-7Q2K9A", records, streams, load, {}, null).sequences.length // 16
 */
export function participantView(
  design: StudyDesign,
  code: string,
  records: readonly TrialRecord[],
  streams: readonly (ParticipantStream & { gz: Buffer | null })[],
  calibration: ParticipantCalibration,
  chosenStreamId: number | null,
): ParticipantView {
  const unit = analysisUnitOf(design.task.unit);
  const conditions = conditionsOf(design);
  const byLabel = new Map(conditions.map((c) => [c.label, c]));
  const opts = analysisOptionsSchema.parse({ unit, geometry: geometryOf(design.task.displayMode), start: "actual", exclude: "misfire", file: "trials" });
  const acc = new TrialAccumulator(opts);
  const bySequence = new Map<string, TrialRecord[]>();
  for (const r of records) {
    acc.add(trialRowFromRecord(r, code, byLabel.get(r.condition)?.factorLevels ?? {}));
    const key = JSON.stringify([r.condition, Number(r.block), Number(r.sequence)]);
    const list = bySequence.get(key) ?? [];
    list.push(r);
    bySequence.set(key, list);
  }
  const { sequences } = sequenceSummaries(acc, opts);
  const summaryOf = new Map(sequences.map((s) => [JSON.stringify([s.condition, s.block, s.sequence]), s]));
  const limits = { minSampleRateHz: design.minSampleRateHz, maxGapMs: 100, maxErrorRate: MAX_ERROR_RATE };
  const configOf = (label: string): TransferConfig | null => {
    const c = byLabel.get(label);
    return c ? { ...conditionConfig(design, c), ...calibration.bias } : null;
  };
  const views: ParticipantSequenceView[] = [];
  let trajectory: ParticipantView["trajectory"] = null;
  const seen = new Set<string>();
  const chosen = chosenStreamId ?? streams.find((s) => !s.practice)?.id ?? null;
  for (const s of streams) {
    const key = JSON.stringify([s.condition, s.block, s.sequence]);
    const rows = s.practice ? [] : bySequence.get(key) ?? [];
    const config = configOf(s.condition);
    let replay: Trajectory | null = null;
    let broken: string | null = null;
    const first = rows[0];
    const setup = replaySetupFor(design.task, first ? Number(first.amplitude) : design.task.amplitudes[0]!, calibration);
    if (s.gz && config) {
      if ("reason" in setup) broken = setup.reason;
      else {
        try {
          replay = replayTrajectory(s.gz, config, setup, first ? { x: Number(first.from_x), y: Number(first.from_y) } : { x: 0, y: 0 });
        } catch (e) {
          broken = (e as Error).message;
        }
      }
    }
    if (!s.practice) {
      seen.add(key);
      const summary = summaryOf.get(key) ?? null;
      const flags = qualityFlags(
        { sampleRateHz: replay?.sampleRateHz ?? null, maxGapMs: replay?.maxGapMs ?? null, dropped: replay?.dropped ?? 0, hasStream: s.gz !== null, errorRate: summary?.errorRate ?? null, excluded: summary?.excluded ?? 0, kept: summary ? summary.n : rows.length ? 0 : null, eventDriven: config ? isEventDriven(config.technique) : false },
        limits,
      );
      if (broken) flags.unshift({ level: "warning", text: `the raw stream could not be read: ${broken}` });
      views.push({ condition: s.condition, block: s.block, sequence: s.sequence, summary, streamId: s.id, sampleRateHz: replay?.sampleRateHz ?? null, maxGapMs: replay?.maxGapMs ?? null, flags });
    }
    if (s.id === chosen && replay) {
      trajectory = {
        ...replay, streamId: s.id, condition: s.condition, block: s.block, sequence: s.sequence, practice: s.practice,
        targets: first ? [{ x: Number(first.from_x), y: Number(first.from_y) }, ...rows.map((r) => ({ x: Number(r.to_x), y: Number(r.to_y) }))] : [],
        selections: rows.map((r) => ({ x: Number(r.end_x), y: Number(r.end_y), hit: Number(r.hit) === 1 || r.hit === true })),
        width: first ? Number(first.width) : 0,
      };
    }
  }
  for (const s of sequences) {
    const key = JSON.stringify([s.condition, s.block, s.sequence]);
    if (seen.has(key)) continue;
    views.push({ condition: s.condition, block: s.block, sequence: s.sequence, summary: s, streamId: null, sampleRateHz: null, maxGapMs: null, flags: qualityFlags({ sampleRateHz: null, maxGapMs: null, dropped: 0, hasStream: false, errorRate: s.errorRate, excluded: s.excluded, kept: s.n }, limits) });
  }
  return { unit, sequences: views, trajectory, thresholds: limits };
}
