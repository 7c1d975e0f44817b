import type { LegacyTrialRow, TrialRow } from "../trials/trialRow";
import { TrialTableError } from "../trials/trialTableError";
import { FLAG_CLUTCHED, FLAG_RECENTERED, FLAG_TIMED_OUT, MovementStore } from "./movementStore";
import type { AnalysisOptions } from "./options";
import { projectMovement } from "./projectMovement";
import { sequenceKey, type SequenceInfo } from "./sequenceInfo";

type Row = LegacyTrialRow & { line?: number };

/** A participant's between-factor levels and the line they were first read on. */
export interface ParticipantGroup {
  groups: Readonly<Record<string, string>>;
  line: number;
}

/**
 * Streaming accumulator: takes movements one at a time (any order) and keeps each sequence once
 * (SequenceInfo) and each movement as a few numbers in a MovementStore: its projection onto the task
 * axis (plane or sphere, from the actual or nominal start), time, hit and flags. Checks that A and
 * W stay constant within a sequence and that a participant's between-factor levels (b_ columns)
 * never change.
 *
 * Cost: O(1) amortised per movement; memory O(sequences + 50 bytes × movements).
 */
export class TrialAccumulator {
  readonly sequences: SequenceInfo[] = [];
  readonly movements = new MovementStore();
  readonly participants = new Map<string, ParticipantGroup>();
  /** Every factor name in the order its column came: f_ names then b_ names as met in the first row. */
  factorOrder: string[] | undefined;
  /** True once a legacy row (no coordinates) was added. */
  legacy = false;
  private readonly index = new Map<string, number>();
  private last = -1;
  private lastParticipant = "";
  private lastGroups: Readonly<Record<string, string>> | undefined;

  constructor(private readonly options: Pick<AnalysisOptions, "start" | "file" | "geometry">) {}

  private fail(line: number | undefined, column: string, message: string): never {
    throw new TrialTableError({ file: this.options.file, line: line ?? 0, column }, message);
  }

  private sequenceFor(row: Row): number {
    const last = this.sequences[this.last];
    if (last !== undefined && last.sequence === row.sequence && last.block === row.block && last.participant === row.participant && last.condition === row.condition) {
      this.checkSizes(last, row);
      last.rows++;
      return this.last;
    }
    const key = sequenceKey(row.participant, row.condition, row.block, row.sequence);
    let i = this.index.get(key);
    if (i === undefined) {
      i = this.sequences.length;
      this.sequences.push({
        key,
        participant: row.participant,
        condition: row.condition,
        block: row.block,
        sequence: row.sequence,
        amplitude: row.amplitude,
        width: row.width,
        factors: row.factors,
        groups: row.groups,
        firstLine: row.line ?? 0,
        rows: 0,
      });
      this.index.set(key, i);
      this.factorOrder ??= [...Object.keys(row.factors), ...Object.keys(row.groups ?? {})];
    } else {
      this.checkSizes(this.sequences[i]!, row);
    }
    this.sequences[i]!.rows++;
    this.last = i;
    return i;
  }

  private checkSizes(s: SequenceInfo, row: Row): void {
    if (row.amplitude !== s.amplitude || row.width !== s.width) {
      const column = row.amplitude !== s.amplitude ? "amplitude" : "width";
      this.fail(row.line, column, `${column} changes within sequence ${row.sequence} (was ${column === "amplitude" ? s.amplitude : s.width})`);
    }
  }

  private checkGroups(row: Row): void {
    const groups = row.groups;
    if (groups === undefined) return;
    if (row.participant === this.lastParticipant && groups === this.lastGroups) return;
    const known = this.participants.get(row.participant);
    if (known === undefined) {
      this.participants.set(row.participant, { groups, line: row.line ?? 0 });
    } else if (known.groups !== groups) {
      for (const [name, level] of Object.entries(groups)) {
        if (known.groups[name] !== level) {
          this.fail(row.line, `b_${name}`, `participant ${row.participant} is in level "${known.groups[name]}" of between factor ${name} on line ${known.line}, "${level}" here; a between factor must not change within a participant`);
        }
      }
    }
    this.lastParticipant = row.participant;
    this.lastGroups = groups;
  }

  private static flagsOf(row: Row): number {
    return (row.timedOut ? FLAG_TIMED_OUT : 0) | (row.recentered ? FLAG_RECENTERED : 0) | (row.clutched ? FLAG_CLUTCHED : 0);
  }

  /** Adds one movement with coordinates. @throws TrialTableError when S coincides with T, or as above. */
  add(row: TrialRow & { line?: number }): void {
    this.checkGroups(row);
    const seq = this.sequenceFor(row);
    const nominal = this.options.start === "nominal";
    const sx = nominal ? row.fromX : row.startX;
    const sy = nominal ? row.fromY : row.startY;
    let dx: number;
    let distance: number;
    let endError: number;
    if (this.options.geometry === "plane") {
      // Inlined projectMovement: this runs for every row of large tables.
      const ux = row.toX - sx;
      const uy = row.toY - sy;
      const a = Math.sqrt(ux * ux + uy * uy);
      if (!(a > 0)) this.fail(row.line, nominal ? "from_x" : "start_x", "the movement's start coincides with the target centre");
      const ex = row.endX - row.toX;
      const ey = row.endY - row.toY;
      dx = (ex * ux + ey * uy) / a;
      distance = a + dx;
      endError = Math.sqrt(ex * ex + ey * ey);
    } else {
      try {
        ({ dx, distance, endError } = projectMovement(sx, sy, row.toX, row.toY, row.endX, row.endY, "sphere"));
      } catch {
        this.fail(row.line, nominal ? "from_x" : "start_x", "the movement's start coincides with the target centre's direction or is opposite it");
      }
    }
    this.movements.push(seq, row.trial, row.line ?? 0, dx, distance, endError, row.timeMs, row.hit, TrialAccumulator.flagsOf(row));
  }

  /** Adds one movement of a legacy table (no coordinates: Ae = A, no projection). */
  addLegacy(row: LegacyTrialRow & { line?: number }): void {
    this.legacy = true;
    this.checkGroups(row);
    const seq = this.sequenceFor(row);
    this.movements.push(seq, row.trial, row.line ?? 0, 0, row.amplitude, 0, row.timeMs, row.hit, TrialAccumulator.flagsOf(row));
  }

  /**
   * Adds the sequences and movements another accumulator read from a later part of the same
   * table (worker threads), with the same checks across the boundary.
   * @throws TrialTableError when a sequence's A or W or a participant's group differs between the parts.
   */
  merge(other: TrialAccumulator): void {
    const map = new Int32Array(other.sequences.length);
    other.sequences.forEach((s, j) => {
      const i = this.index.get(s.key);
      if (i === undefined) {
        map[j] = this.sequences.length;
        this.index.set(s.key, this.sequences.length);
        this.sequences.push({ ...s });
      } else {
        const known = this.sequences[i]!;
        if (known.amplitude !== s.amplitude || known.width !== s.width) {
          const column = known.amplitude !== s.amplitude ? "amplitude" : "width";
          this.fail(s.firstLine, column, `${column} changes within sequence ${s.sequence}`);
        }
        known.rows += s.rows;
        map[j] = i;
      }
    });
    for (const [code, g] of other.participants) {
      const known = this.participants.get(code);
      if (known === undefined) this.participants.set(code, g);
      else {
        for (const [name, level] of Object.entries(g.groups)) {
          if (known.groups[name] !== level) {
            this.fail(g.line, `b_${name}`, `participant ${code} is in level "${known.groups[name]}" of between factor ${name} on line ${known.line}, "${level}" here; a between factor must not change within a participant`);
          }
        }
      }
    }
    this.factorOrder ??= other.factorOrder;
    this.legacy ||= other.legacy;
    this.movements.append(other.movements, map);
  }
}
