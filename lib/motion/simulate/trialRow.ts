import { csvField } from "../../csv/csvField";
import type { MovementColumns } from "../../trials/movementColumns";

/** One movement, with the columns of the trial table (interfaces.md "Trial table"). */
export interface TrialRow extends MovementColumns {
  participant: string;
  condition: string;
  block: number;
  sequence: number;
  trial: number;
  amplitude: number;
  width: number;
  hit: 0 | 1;
}

export const trialColumns = [
  "participant", "condition", "block", "sequence", "trial", "amplitude", "width",
  "from_x", "from_y", "to_x", "to_y", "start_x", "start_y", "end_x", "end_y", "time_ms", "hit",
] as const satisfies readonly (keyof TrialRow)[];


/**
 * Trial rows as a trial-table CSV (formatTrialCsv).
 *
 * Purpose: simulated sessions in the format `npm run analyze` reads. Source: interfaces.md
 * "Trial table"; RFC 4180 quoting. Cost: O(rows).
 * @throws never.
 * @example formatTrialCsv([]).trim() // "participant,condition,block,sequence,trial,amplitude,width,from_x,from_y,to_x,to_y,start_x,start_y,end_x,end_y,time_ms,hit"
 */
export function formatTrialCsv(rows: readonly TrialRow[]): string {
  const lines = [trialColumns.join(",")];
  for (const r of rows) lines.push(trialColumns.map((c) => csvField(r[c])).join(","));
  return lines.join("\n") + "\n";
}
