/** A point in the task plane, in the table's unit (px, mm or deg); y grows downwards on screens. */
export interface Point {
  readonly x: number;
  readonly y: number;
}
