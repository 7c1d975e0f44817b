import { db } from "@/lib/db";
import { fetchPlaceBalance } from "@/lib/data/places";
import { fetchDesign } from "@/lib/study/service/design";
import { editLock, fetchInForceVersion } from "@/lib/study/service/protocol";
import { DesignForm } from "@/components/study/DesignForm";
import { PlaceBalanceTable } from "@/components/study/PlaceBalanceTable";
import { studyForPage } from "../access";

export const metadata = { title: "Design" };

export default async function DesignPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit } = await studyForPage((await params).id);
  const [{ design }, lock, inForce] = await Promise.all([fetchDesign(db, study.id), editLock(db, study, "design"), fetchInForceVersion(db, study.id)]);
  const balance = design ? await fetchPlaceBalance(db, study.id, design) : null;
  return (
    <div className="space-y-3">
      {lock && <p className="notice">{lock}</p>}
      {!lock && inForce && <p className="notice">Protocol version {inForce.version} is approved. Saving a change starts an amendment: participants keep the approved version until a reviewer approves the amendment (Review tab).</p>}
      {balance && <PlaceBalanceTable cells={balance.cells} released={balance.released} design={design!} />}
      <DesignForm studyId={study.id} initial={design} readOnly={!canEdit || lock !== null} />
    </div>
  );
}
