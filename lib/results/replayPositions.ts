import type { TransferConfig } from "../motion/config";
import { sampleFromTable, type SampleTable } from "../motion/csv";
import { createMotionEngine } from "../motion/engine";
import type { MotionSample } from "../motion/sample";
import type { Point } from "../task/point";

/** How a stream's engine output maps onto the task: the display mode and, in cursor mode, CSS px per task unit. */
export interface ReplaySetup {
  displayMode: "cursor" | "view";
  /** Cursor mode: CSS pixels per task unit (pixelsPerTaskUnit from the participant's calibration); view mode: 1. */
  pixelsPerUnit: number;
}

/** The aim after every sample of a stream, in task units (cursor mode) or degrees of yaw and pitch (view mode). */
export interface ReplayedPositions {
  /** Sample times, ms, in the stream's own clock. */
  t: Float64Array;
  x: Float64Array;
  y: Float64Array;
  /** Samples the engine refused (invalid values, time going backwards); their position repeats the previous one. */
  dropped: number;
  /** Longest interval between successive samples, ms. */
  maxGapMs: number;
}

/**
 * Replays a raw stream through a condition's transfer configuration (replayPositions), as the
 * session's task did: the aim starts on the sequence's first target and moves by the engine's
 * output each sample (cursor mode: px divided by the pixels per task unit; view mode: degrees of
 * yaw and pitch). The configuration's display mode is set to the study's, as the runner sets it.
 * The runner also keeps the cursor on the canvas, whose size is not recorded: a replayed cursor
 * that would have hit the screen's edge can differ from the live one.
 * Source: the project's engine (lib/motion), interfaces.md "Raw sensor stream".
 * Cost: O(samples).
 * @throws never (invalid samples are counted in `dropped`).
 * @example replayPositions(table, config, { displayMode: "cursor", pixelsPerUnit: 1 }, { x: 0, y: -150 }).x.length // 842
 */
export function replayPositions(table: SampleTable, config: TransferConfig, setup: ReplaySetup, start: Point): ReplayedPositions {
  const engine = createMotionEngine({ ...config, displayMode: setup.displayMode });
  const scale = setup.displayMode === "view" ? 1 : setup.pixelsPerUnit;
  // Absolute touch positions (pointer_x/y, the touch technique in cursor mode) move the output from
  // where the engine thinks it is: the first target, in output units (px from the task's centre).
  engine.setPosition(start.x * scale, start.y * scale);
  const n = table.length;
  const t = new Float64Array(n);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const sample: MotionSample = { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 };
  let px = start.x, py = start.y, maxGapMs = 0;
  for (let i = 0; i < n; i++) {
    sampleFromTable(table, i, sample);
    if (i > 0) maxGapMs = Math.max(maxGapMs, sample.tMs - t[i - 1]!);
    const o = engine.push(sample);
    if (o) {
      px += o.dx / scale;
      py += o.dy / scale;
    }
    t[i] = sample.tMs;
    x[i] = px;
    y[i] = py;
  }
  return { t, x, y, dropped: engine.dropped, maxGapMs };
}
