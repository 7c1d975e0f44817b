"use client";

import { startTransition, useEffect, useState } from "react";
import { useWatch } from "react-hook-form";
import type { StudyDesignInput } from "@/lib/study/design";
import { DesignOverview } from "./DesignOverview";
import type { DesignControl } from "./formTypes";

/** How long typing pauses before the overview follows (common practice for live previews, from memory: 200–300 ms). */
const PAUSE_MS = 250;

/**
 * The overview of the form's values (summary, pictures, checks, power), drawn again once typing
 * pauses, as a transition: recomputing it for a large design takes longer than a frame, so it
 * never runs between two keys of someone typing. The only part of the form that watches every value.
 */
export function LiveOverview({ control, studyId }: { control: DesignControl; studyId: number }) {
  const values = useWatch({ control }) as StudyDesignInput;
  const [shown, setShown] = useState(values);
  useEffect(() => {
    if (values === shown) return;
    const timer = setTimeout(() => startTransition(() => setShown(values)), PAUSE_MS);
    return () => clearTimeout(timer);
  }, [values, shown]);
  return <DesignOverview values={shown} studyId={studyId} />;
}
