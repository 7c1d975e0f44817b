import { db } from "@/lib/db";
import { missingConsentElements } from "@/lib/consent/consentChecklist";
import { listConsentVersions } from "@/lib/study/service/consent";
import { fetchDesign } from "@/lib/study/service/design";
import { listReviews } from "@/lib/study/service/review";
import { ActionButton } from "@/components/study/ActionButton";
import { studyForPage } from "../access";

export const metadata = { title: "Review" };

export default async function ReviewTabPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit } = await studyForPage((await params).id);
  const [reviews, versions, stored] = await Promise.all([listReviews(db, study.id), listConsentVersions(db, study.id), fetchDesign(db, study.id)]);
  const latest = versions[0];
  const missing = latest ? missingConsentElements(latest.body) : [];
  return (
    <div className="space-y-4">
      <p className="max-w-prose text-sm">Submitting sends the saved design and the newest consent version to the ethics reviewers. The consent version is frozen and fingerprinted (SHA-256); after a decision, any change needs a new version and a new review. Your ethics board's procedures decide what it needs.</p>
      <ul className="text-sm">
        <li>Design: {stored.design ? "saved" : "not saved yet"}</li>
        <li>Consent: {latest ? `version ${latest.version}, ${latest.status}` : "not written yet"}</li>
        {missing.length > 0 && <li>The consent checklist finds missing: {missing.join("; ")}</li>}
      </ul>
      {canEdit && study.status === "draft" && <ActionButton url={`/api/studies/${study.id}/submit`} label="Submit for review" done="Submitted for review." />}
      <section className="space-y-2">
        <h2>Reviews</h2>
        {reviews.length === 0 ? <p className="text-sm">Nothing submitted yet.</p> : (
          <table><thead><tr><th>Submitted</th><th>By</th><th>Consent version</th><th>Decision</th><th>Reviewer</th><th>Comment</th></tr></thead>
            <tbody>{reviews.map((r) => <tr key={r.id}><td>{r.submittedAt.toISOString().slice(0, 16).replace("T", " ")}</td><td>{r.submittedBy}</td><td>{r.consentVersion}</td><td>{r.status === "submitted" ? "waiting" : r.status}</td><td>{r.decidedBy ?? "—"}</td><td>{r.comment ?? "—"}</td></tr>)}</tbody>
          </table>
        )}
      </section>
    </div>
  );
}
