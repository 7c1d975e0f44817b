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

/**
 * How the trial table's coordinates are read for a study (geometryOf): view-mode studies record
 * view directions (yaw, pitch in degrees) and are analysed on the sphere (science.md §1 "View
 * mode"); cursor-mode studies record points on the screen.
 * Cost: O(1).
 * @throws never.
 * @example geometryOf("view") // "sphere"
 */
export function geometryOf(displayMode: StudyDesign["task"]["displayMode"]): "plane" | "sphere" {
  return displayMode === "view" ? "sphere" : "plane";
}
