/**
 * The per-movement coordinate and time columns of the trial table (interfaces.md "Trial table"),
 * in its snake_case names; shared by the runner's recorder, the simulator and the stored rows.
 */
export interface MovementColumns {
  from_x: number;
  from_y: number;
  to_x: number;
  to_y: number;
  start_x: number;
  start_y: number;
  end_x: number;
  end_y: number;
  time_ms: number;
}
