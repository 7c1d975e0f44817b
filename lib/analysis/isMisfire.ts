/**
 * Misfire rule (common practice): a selection is a misfire, removed from the analysis rather than
 * counted as a miss, when its distance along the task axis is under A/2 or it lands more than 2W
 * from the target centre. A and W are the nominal amplitude and width.
 *
 * Cost: O(1).
 * @throws never.
 * @example isMisfire(40, 5, 256, 32) // true (40 < 128)
 */
export function isMisfire(distance: number, endError: number, amplitude: number, width: number): boolean {
  return distance < amplitude / 2 || endError > 2 * width;
}
