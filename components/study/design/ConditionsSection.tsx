"use client";

import { memo, useDeferredValue, useMemo } from "react";
import { useController, useWatch } from "react-hook-form";
import { CONDITION_SEPARATOR, type StudyDesignInput } from "@/lib/study/design";
import { designFieldLabels as L } from "@/lib/study/editor";
import { Err } from "./Err";
import type { DesignControl, DesignErrors } from "./formTypes";

/** The levels' labels of every factor, as one string: the crossing changes only when it does. */
function levelLabelsKey(factors: StudyDesignInput["factors"] | undefined): string {
  return JSON.stringify((factors ?? []).map((f) => (f?.levels ?? []).map((l) => l?.label ?? "")));
}

/** Every combination of one level per factor, by label, in the order the crossing lists conditions. */
function crossingOf(labelsKey: string): string[] {
  let combos: string[][] = [[]];
  for (const labels of JSON.parse(labelsKey) as string[][]) combos = combos.flatMap((c) => labels.map((l) => [...c, l]));
  return combos.map((c) => c.join(CONDITION_SEPARATOR));
}

/** The list of crossed conditions to choose from (up to hundreds of boxes): drawn again only when the crossing or the choice changes. */
const ConditionChoices = memo(function ConditionChoices({ crossing, subset, onChange }: { crossing: string[]; subset: string[] | null; onChange: (v: string[] | null) => void }) {
  return (
    <div className="space-y-1 text-sm">
      <label className="flex items-center gap-2"><input type="checkbox" checked={subset !== null} onChange={(e) => onChange(e.target.checked ? [...crossing] : null)} /> {L.conditionSubset} ({crossing.length})</label>
      {subset !== null && crossing.map((c) => (
        <label key={c} className="ml-6 flex items-center gap-2"><input type="checkbox" checked={subset.includes(c)} onChange={(e) => onChange(e.target.checked ? [...subset, c] : subset.filter((x) => x !== c))} /> {c}</label>
      ))}
    </div>
  );
});

/** Which crossed conditions the study runs: all of them, or a chosen subset. Follows the levels' labels only. */
export function ConditionsSection({ control, errors }: { control: DesignControl; errors: DesignErrors }) {
  const labelsKey = useWatch({ control, name: "factors", compute: levelLabelsKey });
  // the list follows a label typed a frame later, so the key itself is shown first
  const laterLabelsKey = useDeferredValue(labelsKey);
  const crossing = useMemo(() => crossingOf(laterLabelsKey), [laterLabelsKey]);
  const { field } = useController({ control, name: "conditionSubset" });
  return (
    <section className="space-y-2">
      <h2>Conditions</h2>
      <ConditionChoices crossing={crossing} subset={field.value ?? null} onChange={field.onChange} />
      <Err errors={errors} path="conditionSubset" />
    </section>
  );
}
