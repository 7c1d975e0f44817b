import type { TransferConfig } from "../config";
import { usesChannel } from "../engineCore";

/**
 * Whether a configuration reads "up" from the accelerometer (gravityCheckNeeded): the gravity
 * and adaptive frames and tilt-rate do, so their studies run checkGravitySign. A module of its
 * own, so the participant page can ask this without loading the check. Cost: O(1).
 * @example gravityCheckNeeded(parseTransferConfig({ frame: "adaptive" })) // true
 */
export function gravityCheckNeeded(config: Pick<TransferConfig, "technique" | "frame">): boolean {
  return usesChannel(config.technique, "tilt") || (usesChannel(config.technique, "motion") && config.frame !== "device");
}
