import type { StudyStatus } from "@/lib/data/studies";

const LABEL: Record<StudyStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  recruiting: "Recruiting",
  closed: "Closed",
};

/** Status in words (never colour alone). */
export function StatusBadge({ status }: { status: StudyStatus }) {
  return <span className="rounded border border-slate-300 bg-slate-50 px-1.5 py-0.5 text-xs font-medium text-slate-800">{LABEL[status]}</span>;
}
