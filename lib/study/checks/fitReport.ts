import { conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import { allowedDeviceClasses, type DeviceClass } from "./deviceClasses";
import { targetFit, type FitResult } from "./targetFit";

export interface FitReport {
  devices: DeviceClass[];
  /** One row per A×W, one result per device class (in `devices` order). */
  rows: { amplitude: number; width: number; results: FitResult[] }[];
  /** The smallest target in mm on each device class (null where the unit does not allow it). */
  smallestTargetMm: (number | null)[];
  /** Plain sentences, one per device class on which something does not fit. */
  warnings: string[];
}

/**
 * Fit of every A×W on every device class the study's techniques allow (fitReport), with the
 * smallest target in physical size. Cost: O(conditions + |A|·|W|·devices).
 * @throws never for a design that passed studyDesignSchema.
 * @example fitReport(demoDesign).warnings[0] // "phone, portrait: A 480 × W 60 px does not fit (…)"
 */
export function fitReport(design: StudyDesign): FitReport {
  const techniques = conditionsOf(design).map((c) => conditionConfig(design, c).technique);
  const devices = allowedDeviceClasses(techniques);
  const t = design.task;
  const rows = t.amplitudes.flatMap((a) => t.widths.map((w) => ({ amplitude: a, width: w, results: devices.map((d) => targetFit(t, a, w, d)) })));
  const minW = Math.min(...t.widths);
  const smallestTargetMm = devices.map((d) => targetFit(t, Math.max(...t.amplitudes), minW, d).targetMm);
  const unit = t.displayMode === "view" ? "°" : ` ${t.unit}`;
  const warnings = devices.flatMap((d, di) => {
    const bad = rows.filter((r) => !r.results[di]!.fits);
    if (bad.length === 0) return [];
    const r = bad[0]!.results[di]!;
    const need = t.displayMode === "view" ? `${r.needed.toFixed(0)}° of a ${r.available.toFixed(0)}° field of view` : `${r.needed.toFixed(0)} px of ${r.available.toFixed(0)} px`;
    return [`${d.label}: ${bad.map((b) => `A ${b.amplitude} × W ${b.width}${unit}`).join(", ")} ${bad.length === 1 ? "does" : "do"} not fit (${t.displayMode === "view" ? "not every target in view at once" : "targets would run off the screen"}; the first needs ${need}).`];
  });
  return { devices, rows, smallestTargetMm, warnings };
}
