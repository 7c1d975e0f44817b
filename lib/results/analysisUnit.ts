import type { StudyDesign } from "../study/design";

/**
 * The analysis unit for a study's task unit (analysisUnitOf): visual and view degrees are both
 * "deg" in the trial table (interfaces.md).
 * Cost: O(1).
 * @throws never.
 * @example analysisUnitOf("deg-view") // "deg"
 */
export function analysisUnitOf(unit: StudyDesign["task"]["unit"]): "px" | "mm" | "deg" {
  return unit === "px" ? "px" : unit === "mm" ? "mm" : "deg";
}
