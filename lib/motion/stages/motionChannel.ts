import type { StageWork } from "./work";

/**
 * The motion channel's last stage (motionViewStep): view rate → this sample's view change.
 *
 * Purpose: after reference frame → dead band → gain curve → fine-aim smoothing, the rotation
 * channel is position-like: its view change over the sample is rate × Δt (science.md §8:
 * Δyaw = G·gx·h·Δt, Δpitch = G·gy·v·Δt), added to `viewX/viewY`. Cost: O(1).
 * @throws never.
 * @example work.viewRateX = -180; work.dtS = 0.1; motionViewStep(work); work.viewX // -18
 */
export function motionViewStep(work: StageWork): void {
  work.viewX += work.viewRateX * work.dtS;
  work.viewY += work.viewRateY * work.dtS;
}
