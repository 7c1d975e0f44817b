import type { Control, FieldErrors, UseFormRegister } from "react-hook-form";
import type { StudyDesign, StudyDesignInput } from "@/lib/study/design";

export type DesignControl = Control<StudyDesignInput, unknown, StudyDesign>;
export type DesignRegister = UseFormRegister<StudyDesignInput>;
export type DesignErrors = FieldErrors<StudyDesignInput>;
