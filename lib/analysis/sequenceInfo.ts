/**
 * One sequence (participant × condition × block × sequence) as read: what identifies it, its
 * nominal A and W, the factor levels of its condition and its participant's group, where it starts
 * in the file and how many rows it has. Its movements live in a MovementStore.
 */
export interface SequenceInfo {
  key: string;
  participant: string;
  condition: string;
  block: number;
  sequence: number;
  amplitude: number;
  width: number;
  /** f_NAME levels of the condition. */
  factors: Readonly<Record<string, string>>;
  /** b_NAME levels of the participant; undefined without b_ columns. */
  groups: Readonly<Record<string, string>> | undefined;
  /** First line of the sequence in its file (0 when unknown). */
  firstLine: number;
  /** Rows seen (kept and excluded). */
  rows: number;
}

/** Key of one sequence. */
export function sequenceKey(participant: string, condition: string, block: number, sequence: number): string {
  return `${participant}\u0000${condition}\u0000${block}\u0000${sequence}`;
}

/** Key of one movement, for looking up its path measures. */
export function movementKey(participant: string, condition: string, block: number, sequence: number, trial: number): string {
  return `${sequenceKey(participant, condition, block, sequence)}\u0000${trial}`;
}
