import { MAX_SQUARE_CONDITIONS } from "./conditionLimit";

/** Checks that a condition count is a whole number from 1 to 64 (shared by the square builders). */
export function assertConditionCount(fn: string, n: number): void {
  if (!Number.isInteger(n) || n < 1 || n > MAX_SQUARE_CONDITIONS) throw new Error(`${fn} requires a whole number of conditions from 1 to ${MAX_SQUARE_CONDITIONS}, got ${n}`);
}
