import { db } from "@/lib/db";
import { consentDiff } from "@/lib/consent/consentDiff";
import { latestApprovedConsent, listConsentVersions } from "@/lib/study/service/consent";
import { editLock, fetchWorkingCopy } from "@/lib/study/service/protocol";
import { ConsentEditor } from "@/components/study/ConsentEditor";
import { ConsentMarkdown } from "@/components/study/ConsentMarkdown";
import { DiffView } from "@/components/study/DiffView";
import { studyForPage } from "../access";

export const metadata = { title: "Consent" };

const STARTER = `## Purpose of the study\n\n## What you will do\n\n## How long it takes\n\n## Risks and discomforts\nTurning the device again and again can strain the wrist. Turning the view can cause motion sickness. Targets flash briefly when hit.\n\n## Benefits\n\n## Compensation\n\n## Confidentiality and data handling\n\n## Voluntary participation and withdrawal\n\n## Contacts\n`;

export default async function ConsentPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner } = await studyForPage((await params).id);
  const [versions, approved, lock, working] = await Promise.all([listConsentVersions(db, study.id), latestApprovedConsent(db, study.id), editLock(db, study, "consent text"), fetchWorkingCopy(db, study.id)]);
  const latest = versions[0];
  const previous = versions[1];
  const editable = canEdit && lock === null;
  return (
    <div className="space-y-5">
      {canEdit && lock && <p className="notice">{lock}</p>}
      {editable && approved && <p className="notice">Version {approved.version} is approved. A new version is part of an amendment: participants keep consenting to version {approved.version} until a reviewer approves the amendment (Review tab).</p>}
      {editable ? (
        <ConsentEditor studyId={study.id} initial={latest?.body ?? STARTER} erasureWindowDays={working.erasureWindowDays} note={latest && latest.status !== "draft" ? `Version ${latest.version} is ${latest.status} and frozen; saving starts version ${latest.version + 1}.` : latest ? `Editing draft version ${latest.version}.` : "Saving starts version 1."} />
      ) : (
        latest && <div className="card"><ConsentMarkdown text={latest.body} /></div>
      )}
      <section className="space-y-2">
        <h2>Versions</h2>
        <table><thead><tr><th>Version</th><th>Status</th><th>SHA-256 (frozen text)</th><th>Submitted</th><th>Decision comment</th></tr></thead>
          <tbody>{versions.map((v) => <tr key={v.id}><td>{v.version}</td><td>{v.status}</td><td><code className="text-xs break-all">{v.sha256 ?? "not frozen yet"}</code></td><td>{v.submittedAt?.toISOString().slice(0, 16).replace("T", " ") ?? "—"}</td><td>{v.decisionComment ?? "—"}</td></tr>)}</tbody>
        </table>
      </section>
      {isOwner && (
        <p className="text-sm">
          <a href={`/api/studies/${study.id}/consent-register`} download>Consent register (CSV)</a>: who consented to which version, when, and any withdrawal.
          It identifies participants: for the owner and the ethics reviewers only, never for the open archive; every download is audit-logged.
        </p>
      )}
      {latest && previous && <section className="space-y-2"><h2>Changes from version {previous.version} to {latest.version}</h2><DiffView label={`Diff from version ${previous.version} to ${latest.version}`} parts={consentDiff(previous.body, latest.body)} /></section>}
      {latest && approved && approved.id !== latest.id && <section className="space-y-2"><h2>Changes since the approved version {approved.version}</h2><DiffView label="Diff to the approved version" parts={consentDiff(approved.body, latest.body)} /></section>}
    </div>
  );
}
