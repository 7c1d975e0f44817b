import type { TransferConfig } from "@/lib/motion/config";
import { simulateSequence, type SimulatedParticipant } from "@/lib/motion/simulate";
import { sequenceLayout } from "@/lib/runner/geometry";
import type { TrialRecord } from "@/lib/results/trialRecord";
import { trialRowFromRecord } from "@/lib/results/trialRecord";
import type { TrialRow } from "@/lib/trials/trialRow";
import { fittsMovementTimeMs } from "@/lib/motion/simulate/minimumJerk";

type TaskLike = { type: "ring" | "strip"; targetsPerRing: number; unit: "px" | "mm" | "deg-visual" | "deg-view"; trialTimeLimitMs: number };

/** Techniques the simulated participant moves with a sensor stream (lib/motion/simulate). */
export function simulatedTechnique(config: TransferConfig): boolean {
  try {
    simulateSequence({ targets: [{ x: 0, y: 0 }, { x: 10, y: 0 }], amplitude: 10, width: 2 }, config, { seed: 1, restMs: 0 });
    return true;
  } catch {
    return false;
  }
}

/** The person the checks simulate: the simulated participant's own defaults, a phone for hand-held techniques. */
export function checkParticipant(config: TransferConfig, seed: number): SimulatedParticipant {
  const handHeld = config.technique === "touch" || config.technique === "motion+touch" || config.technique === "tilt-rate";
  return { seed, sensor: handHeld ? "phone" : "controller", restMs: 300 };
}

/**
 * One simulated sequence at a condition's settings (simulatedSequenceRows): the task's targets
 * in visiting order (ISO 9241-411 ring or strip), run by the simulated participant through the
 * engine at `config`, as trial rows the project's analysis reads. Returns null for a technique
 * the simulated participant does not move. Task units are taken as the engine's output units
 * (movement time depends on A/W, not on the unit). Cost: O(samples of the sequence).
 * @throws never for a valid design's task.
 */
export function simulatedSequenceRows(task: TaskLike, amplitude: number, width: number, config: TransferConfig, person: SimulatedParticipant, labels: { participant: string; condition: string; block: number; sequence: number }): TrialRow[] | null {
  const layout = sequenceLayout(task.type, task.targetsPerRing, amplitude, width);
  let sim;
  try {
    sim = simulateSequence({ targets: layout.order, amplitude, width, ...labels }, config, person);
  } catch {
    return null;
  }
  return sim.trials.map((t) => trialRowFromRecord({ ...t, participant_id: 0, timed_out: 0, recentered: 0, clutched: 0 } satisfies TrialRecord, labels.participant, {}));
}

/**
 * Movement time of the simulated participant's timing model without a sensor stream
 * (fittsFallbackMs): MT = a + b·log2(A/W + 1) with its default a and b, at least its still dwell
 * plus 150 ms, as simulateSequence plans each movement. For techniques it does not move yet.
 * Source: science.md §9 (Fitts/Shannon MT). Cost: O(1).
 * @throws never.
 */
export function fittsFallbackMs(config: TransferConfig, amplitude: number, width: number): number {
  const dwell = 100 + config.addedLatencyMs + 3 * config.smoothingTimeMs;
  return Math.max(dwell + 150, fittsMovementTimeMs(300, 150, amplitude, width));
}
