import { db } from "@/lib/db";
import { missingConsentElements } from "@/lib/consent/consentChecklist";
import { protocolChanges } from "@/lib/study/protocolChanges";
import { listConsentVersions } from "@/lib/study/service/consent";
import { fetchDesign } from "@/lib/study/service/design";
import { fetchOpenReview, fetchWorkingCopy, listProtocolVersions } from "@/lib/study/service/protocol";
import { listReviews } from "@/lib/study/service/review";
import { ActionButton } from "@/components/study/ActionButton";
import { ProtocolChangesView } from "@/components/study/ProtocolChangesView";
import { studyForPage } from "../access";

export const metadata = { title: "Review" };

const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : "—");

export default async function ReviewTabPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit } = await studyForPage((await params).id);
  const [reviews, versions, stored, protocol, working, open] = await Promise.all([
    listReviews(db, study.id), listConsentVersions(db, study.id), fetchDesign(db, study.id), listProtocolVersions(db, study.id), fetchWorkingCopy(db, study.id), fetchOpenReview(db, study.id),
  ]);
  const latest = versions[0];
  const missing = latest ? missingConsentElements(latest.body) : [];
  const inForce = protocol.find((v) => v.status === "approved") ?? null;
  const changes = inForce ? protocolChanges(inForce, working) : [];
  const canAmend = canEdit && inForce !== null && !open && ["approved", "recruiting"].includes(study.status) && changes.length > 0;
  return (
    <div className="space-y-4">
      <p className="max-w-prose text-sm">Submitting sends the working copy (participant information, design, the newest consent version, the invitation text and the erasure window) to the ethics reviewers as a new protocol version. The consent version is frozen and fingerprinted (SHA-256). After approval, changes make an amendment: participants keep the version they consented to, and new participants get the amended version once a reviewer approves it. Your ethics board&apos;s procedures decide what it needs.</p>
      <ul className="text-sm">
        <li>Design: {stored.design ? "saved" : "not saved yet"}</li>
        <li>Consent: {latest ? `version ${latest.version}, ${latest.status}` : "not written yet"}</li>
        <li>Protocol in force: {inForce ? `version ${inForce.version}, approved ${day(inForce.decidedAt)}` : "none approved yet"}{open ? `; version ${open.version} waits for a decision` : ""}</li>
        {missing.length > 0 && <li>The consent checklist finds missing: {missing.join("; ")}</li>}
      </ul>
      {canEdit && study.status === "draft" && <ActionButton url={`/api/studies/${study.id}/submit`} label="Submit for review" done="Submitted for review." />}
      {inForce && (
        <section className="space-y-2">
          <h2>{open ? `Amendment in review (version ${open.version})` : "Pending amendment"}</h2>
          {open ? <ProtocolChangesView changes={protocolChanges(inForce, open)} baseline={`the approved version ${inForce.version}`} /> : <ProtocolChangesView changes={changes} baseline={`the approved version ${inForce.version}`} />}
          {canAmend && <ActionButton url={`/api/studies/${study.id}/submit`} label="Submit the amendment for review" done="The amendment is submitted; participants keep the approved version until it is decided." />}
        </section>
      )}
      <section className="space-y-2">
        <h2>Protocol versions and reviews</h2>
        {reviews.length === 0 ? <p className="text-sm">Nothing submitted yet.</p> : (
          <table aria-label="Protocol versions"><thead><tr><th>Version</th><th>Submitted</th><th>By</th><th>Consent version</th><th>Decision</th><th>Reviewer</th><th>Comment</th><th>Design fingerprint</th></tr></thead>
            <tbody>{reviews.map((r) => <tr key={r.id}><td>{r.version}{inForce?.id === r.id ? " (in force)" : ""}</td><td>{r.submittedAt.toISOString().slice(0, 16).replace("T", " ")}</td><td>{r.submittedBy}</td><td>{r.consentVersion}</td><td>{r.status === "submitted" ? "waiting" : r.status}</td><td>{r.decidedBy ?? "—"}</td><td>{r.comment ?? "—"}</td><td><code className="text-xs">{r.designHash.slice(0, 12)}…</code></td></tr>)}</tbody>
          </table>
        )}
      </section>
    </div>
  );
}
