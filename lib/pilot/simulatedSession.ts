import type { TransferConfig } from "../motion/config";
import type { MotionSample } from "../motion/sample";
import { createSeededRandom, simulateSequence, type SeededRandom, type TrialRow } from "../motion/simulate";
import { sequenceLayout } from "../runner/geometry";
import { planSequences, type PlannedSequence } from "../runner/planCore";
import type { StudyDesign } from "../study/design";
import { PLANNING } from "../study/summary/designSummary";

/**
 * Assumed screen of a simulated participant where the task's unit needs one (our own invented,
 * plausible figures): 6.3 CSS px per mm (about 160 px per inch, a common phone) and a viewing
 * distance of 400 mm.
 */
export const SIMULATED_SCREEN = { pixelsPerMm: 6.3, viewingDistanceMm: 400 } as const;

/** How one simulated person differs from the typical one: multipliers of movement time and of endpoint spread. */
export interface SimulatedPerson {
  seed: number;
  /** Multiplies the Fitts intercept and slope (> 1: slower). */
  speed: number;
  /** Multiplies the endpoint SD (> 1: less precise). */
  precision: number;
}

/**
 * A simulated person drawn from a population (drawSimulatedPerson): speed and precision are
 * log-normal multipliers with median 1 and the given spread as the SD of their logarithm (0.2 ≈
 * people differing by about ±20 %), so they stay positive and a slow person is as likely as a fast
 * one. Source: common practice for between-person variation in simulated participants.
 * Cost: O(1). @throws never.
 * @example drawSimulatedPerson(createSeededRandom(1), 0).speed // 1
 */
export function drawSimulatedPerson(rng: SeededRandom, spread: number): SimulatedPerson {
  return { seed: Math.floor(rng.uniform() * 2 ** 31), speed: Math.exp(spread * rng.normal()), precision: Math.exp(spread * rng.normal()) };
}

/** One sequence a simulated person ran: its plan entry, movements in task units, raw stream. */
export interface SimulatedRun {
  planned: PlannedSequence;
  trials: TrialRow[];
  samples: MotionSample[];
  /** Measured sample rate of the stream, Hz. */
  sampleRateHz: number;
  /** From the first sample to the last selection, ms. */
  durationMs: number;
}

/** Task units per engine output unit: the screen scale where the unit is mm or visual degrees. */
function pixelsPerUnit(design: StudyDesign, amplitude: number): number {
  const unit = design.task.unit;
  if (unit === "px" || unit === "deg-view") return 1;
  if (unit === "mm") return SIMULATED_SCREEN.pixelsPerMm;
  const mm = 2 * SIMULATED_SCREEN.viewingDistanceMm * Math.tan((amplitude * Math.PI) / 360);
  return (mm * SIMULATED_SCREEN.pixelsPerMm) / amplitude;
}

const scaleRow = (t: TrialRow, k: number): TrialRow => ({
  ...t, amplitude: t.amplitude / k, width: t.width / k,
  from_x: t.from_x / k, from_y: t.from_y / k, to_x: t.to_x / k, to_y: t.to_y / k,
  start_x: t.start_x / k, start_y: t.start_y / k, end_x: t.end_x / k, end_y: t.end_y / k,
});

/**
 * A whole session of one simulated person (simulateSession): every sequence of their plan (the
 * runner's plan for this order and seed, practice included) run by lib/motion/simulate's simulated
 * participant through that condition's transfer configuration, the movement parameters scaled by
 * the person. Movements come back in the design's unit.
 * Cost: O(samples). @throws Error from simulateSequence for a technique it cannot simulate.
 * @example simulateSession(design, labels, configs, [1, 0], 7, person).length // plan length
 */
export function simulateSession(
  design: StudyDesign,
  conditionLabels: readonly string[],
  configs: readonly TransferConfig[],
  order: readonly number[],
  planSeed: number,
  person: SimulatedPerson,
  participant = "sim",
): SimulatedRun[] {
  const plan = planSequences(design, conditionLabels, order, planSeed);
  const rng = createSeededRandom(person.seed);
  return plan.map((s) => {
    const k = pixelsPerUnit(design, s.amplitude);
    const layout = sequenceLayout(design.task.type, design.task.targetsPerRing, s.amplitude * k, s.width * k);
    const config = configs[s.conditionIndex]!;
    const sim = simulateSequence(
      { targets: layout.order, amplitude: s.amplitude * k, width: s.width * k, participant, condition: s.condition, block: s.block, sequence: s.sequence },
      config,
      {
        seed: Math.floor(rng.uniform() * 2 ** 31), interceptMs: 300 * person.speed, slopeMsPerBit: 150 * person.speed,
        endpointSd: ((s.width * k) / 4.133) * person.precision, sensor: "phone", restMs: 800, timingSdFraction: 0.08,
      },
    );
    const first = sim.samples[0]?.tMs ?? 0, last = sim.samples.at(-1)?.tMs ?? 0;
    return {
      planned: s,
      trials: sim.trials.map((t) => scaleRow(t, k)),
      samples: sim.samples,
      sampleRateHz: last > first ? ((sim.samples.length - 1) * 1000) / (last - first) : 0,
      durationMs: last - first,
    };
  });
}

/**
 * The minutes one simulated session takes (sessionMinutes): the simulated task time, the study's
 * minimum breaks between conditions and blocks, and the planning allowances for setup and
 * questionnaires (designSummary's PLANNING, stated in the design summary).
 * Cost: O(runs). @throws never.
 * @example sessionMinutes(design, runs) // 21.4
 */
export function sessionMinutes(design: StudyDesign, runs: readonly SimulatedRun[]): number {
  let ms = 0;
  let breaks = 0;
  runs.forEach((r, i) => {
    ms += r.durationMs + PLANNING.secondsPerSequenceSetup * 1000;
    const prev = runs[i - 1]?.planned;
    if (prev && (prev.conditionIndex !== r.planned.conditionIndex || prev.block !== r.planned.block)) breaks++;
  });
  const conditions = new Set(runs.map((r) => r.planned.conditionIndex)).size;
  const items = design.perConditionItems.length * conditions;
  const seconds = ms / 1000 + breaks * design.minBreakSeconds + items * PLANNING.secondsPerQuestionnaireItem;
  return seconds / 60 + PLANNING.setupMinutes + PLANNING.finalQuestionnaireMinutes;
}
