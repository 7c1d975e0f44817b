import { db } from "@/lib/db";
import { fetchDesign } from "@/lib/study/service/design";
import { EDITABLE_STATUSES } from "@/lib/study/status";
import { DesignForm } from "@/components/study/DesignForm";
import { studyForPage } from "../access";

export const metadata = { title: "Design" };

export default async function DesignPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit } = await studyForPage((await params).id);
  const { design } = await fetchDesign(db, study.id);
  const locked = !EDITABLE_STATUSES.includes(study.status);
  return (
    <div className="space-y-3">
      {locked && <p className="notice">The design is locked while the study is {study.status.replace("_", " ")}.</p>}
      {study.status === "approved" && <p className="notice">The study is approved. Saving a change sends it back to draft; it needs a new review before recruitment.</p>}
      <DesignForm studyId={study.id} initial={design} readOnly={!canEdit || locked} />
    </div>
  );
}
