import type { StudyDesign } from "@/lib/study/design";
import type { SessionTime } from "@/lib/study/checks/sessionTime";
import type { ConditionNoise, PowerPoint, PowerRequest } from "@/lib/study/power";

/** Requests to the design checks' Web Worker (checks.worker.ts). */
export type ChecksRequest =
  | { id: number; kind: "time"; design: StudyDesign }
  | { id: number; kind: "power"; design: StudyDesign; request: PowerRequest; people: number; studies: number; seed: number; nValues: number[] };

export type ChecksAnswer =
  | { id: number; kind: "progress"; phase: string; done: number; total: number }
  | { id: number; kind: "time"; result: SessionTime }
  | { id: number; kind: "power"; noise: ConditionNoise[]; points: PowerPoint[] }
  | { id: number; kind: "error"; message: string };
