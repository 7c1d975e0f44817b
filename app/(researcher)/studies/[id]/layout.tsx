import type { ReactNode } from "react";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { StudyTabs } from "@/components/study/StudyTabs";
import { studyForPage } from "./access";

export default async function StudyLayout({ params, children }: { params: Promise<{ id: string }>; children: ReactNode }) {
  const { study, teamRole } = await studyForPage((await params).id);
  return (
    <article className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1>{study.title}</h1>
        <StatusBadge status={study.status} />
        <span className="text-sm text-slate-700">Your role: {teamRole}</span>
      </div>
      <StudyTabs studyId={study.id} />
      <div>{children}</div>
    </article>
  );
}
