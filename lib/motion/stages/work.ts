/**
 * The values one sample carries from stage to stage (one record per engine, reused for every
 * sample so the hot path allocates nothing). Rates are deg/s, positions degrees of view unless
 * named otherwise; "view directions" are x right, y up.
 */
export interface StageWork {
  /** Time since the previous accepted sample (capped), ms and s. */
  dtMs: number;
  dtS: number;
  /** Device-frame angular rates after bias removal (W3C axes). */
  wx: number;
  wy: number;
  wz: number;
  /** The same rates in the screen frame (turned by the screen angle). */
  rx: number;
  ry: number;
  rz: number;
  /** The "up" estimate in the screen frame (unit vector). */
  ux: number;
  uy: number;
  uz: number;
  /** Motion channel: device rate in view directions (after the reference frame and dead band). */
  rateX: number;
  rateY: number;
  /** Motion channel: device speed after the dead band, the speed the gain curve and smoothing read. */
  speed: number;
  /** Motion channel: view rate after the gain curve (and then after fine-aim smoothing). */
  viewRateX: number;
  viewRateY: number;
  /** This sample's view change from the rotation, tilt and stick channels (degrees, x right, y up). */
  viewX: number;
  viewY: number;
  /** This sample's output in output units (cursor: CSS px, y down; view: degrees, y up). */
  outX: number;
  outY: number;
}

/** A fresh work record with every value 0 (createStageWork). Cost: one small object. */
export function createStageWork(): StageWork {
  return {
    dtMs: 0, dtS: 0, wx: 0, wy: 0, wz: 0, rx: 0, ry: 0, rz: 0, ux: 0, uy: 0, uz: 1,
    rateX: 0, rateY: 0, speed: 0, viewRateX: 0, viewRateY: 0, viewX: 0, viewY: 0, outX: 0, outY: 0,
  };
}
