import type { Point } from "../task/point";
import type { LegacyTrialRow, TrialRow } from "../trials/trialRow";
import { TrialTableError } from "../trials/trialTableError";
import { isMisfire } from "./isMisfire";
import type { AnalysisOptions } from "./options";
import { pathAccuracy, type PathAccuracy } from "./pathAccuracy";
import { emptyPathSums, movementKey, PATH_KEYS, sequenceKey, type SequenceState } from "./sequenceState";

type PathMovement = PathAccuracy & { participant: string; condition: string; block: number; sequence: number; trial: number };

/**
 * Streaming accumulator: takes movements one at a time (any order) and keeps only running totals
 * per sequence, so a million rows need no million objects. Checks that A and W stay constant within
 * a sequence.
 */
export class TrialAccumulator {
  readonly states = new Map<string, SequenceState>();
  readonly pathMovements: PathMovement[] = [];
  private last: SequenceState | undefined;
  private readonly nominal: boolean;
  private readonly excludeMisfires: boolean;

  constructor(
    private readonly options: Pick<AnalysisOptions, "start" | "exclude" | "file" | "pathHysteresis">,
    private readonly paths?: ReadonlyMap<string, readonly Point[]>,
  ) {
    this.nominal = options.start === "nominal";
    this.excludeMisfires = options.exclude === "misfire";
  }

  private stateFor(row: LegacyTrialRow & { line?: number }): SequenceState {
    const last = this.last;
    if (
      last !== undefined &&
      last.sequence === row.sequence &&
      last.block === row.block &&
      last.participant === row.participant &&
      last.condition === row.condition
    ) {
      return this.checkSizes(last, row);
    }
    const key = sequenceKey(row.participant, row.condition, row.block, row.sequence);
    let state = this.states.get(key);
    if (state === undefined) {
      state = {
        key,
        participant: row.participant,
        condition: row.condition,
        block: row.block,
        sequence: row.sequence,
        amplitude: row.amplitude,
        width: row.width,
        factors: row.factors,
        firstLine: row.line ?? 0,
        rows: 0,
        kept: 0,
        misses: 0,
        excluded: 0,
        sumDistance: 0,
        sumTimeMs: 0,
        dxMean: 0,
        dxM2: 0,
        pathCount: 0,
        pathSums: emptyPathSums(),
      };
      this.states.set(key, state);
    } else {
      this.checkSizes(state, row);
    }
    this.last = state;
    return state;
  }

  private checkSizes(state: SequenceState, row: LegacyTrialRow & { line?: number }): SequenceState {
    if (row.amplitude !== state.amplitude || row.width !== state.width) {
      const column = row.amplitude !== state.amplitude ? "amplitude" : "width";
      throw new TrialTableError(
        { file: this.options.file, line: row.line ?? 0, column },
        `${column} changes within sequence ${row.sequence} (was ${column === "amplitude" ? state.amplitude : state.width})`,
      );
    }
    return state;
  }

  /** Adds one movement with coordinates. @throws TrialTableError when S coincides with T. */
  add(row: TrialRow & { line?: number }): void {
    const state = this.stateFor(row);
    state.rows++;
    const sx = this.nominal ? row.fromX : row.startX;
    const sy = this.nominal ? row.fromY : row.startY;
    const ux = row.toX - sx;
    const uy = row.toY - sy;
    const a = Math.sqrt(ux * ux + uy * uy);
    if (!(a > 0)) {
      throw new TrialTableError(
        { file: this.options.file, line: row.line ?? 0, column: this.nominal ? "from_x" : "start_x" },
        "the movement's start coincides with the target centre",
      );
    }
    const ex = row.endX - row.toX;
    const ey = row.endY - row.toY;
    const dx = (ex * ux + ey * uy) / a;
    const distance = a + dx;
    if (this.excludeMisfires && isMisfire(distance, Math.sqrt(ex * ex + ey * ey), row.amplitude, row.width)) {
      state.excluded++;
      return;
    }
    state.kept++;
    if (!row.hit) state.misses++;
    state.sumDistance += distance;
    state.sumTimeMs += row.timeMs;
    const delta = dx - state.dxMean;
    state.dxMean += delta / state.kept;
    state.dxM2 += delta * (dx - state.dxMean);
    if (this.paths !== undefined) this.addPath(state, row);
  }

  private addPath(state: SequenceState, row: TrialRow): void {
    const samples = this.paths!.get(movementKey(row.participant, row.condition, row.block, row.sequence, row.trial));
    if (samples === undefined || samples.length < 2) return;
    if (row.fromX === row.toX && row.fromY === row.toY) return;
    const m = pathAccuracy(samples, { x: row.fromX, y: row.fromY }, { x: row.toX, y: row.toY }, row.width, {
      hysteresis: this.options.pathHysteresis,
    });
    state.pathCount++;
    for (const k of PATH_KEYS) state.pathSums[k] += m[k];
    this.pathMovements.push({ participant: row.participant, condition: row.condition, block: row.block, sequence: row.sequence, trial: row.trial, ...m });
  }

  /** Adds one movement of a legacy table (no coordinates: no projection, no exclusion). */
  addLegacy(row: LegacyTrialRow & { line?: number }): void {
    const state = this.stateFor(row);
    state.rows++;
    state.kept++;
    if (!row.hit) state.misses++;
    state.sumDistance += row.amplitude;
    state.sumTimeMs += row.timeMs;
  }
}
