import Link from "next/link";
import { notFound } from "next/navigation";
import { assertCanViewStudy, requireRole } from "@/lib/auth/guards";
import { consentChecklist } from "@/lib/consent/consentChecklist";
import { consentDiff } from "@/lib/consent/consentDiff";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";
import { listDocuments } from "@/lib/storage/documents";
import { latestApprovedConsent, listConsentVersions } from "@/lib/study/service/consent";
import { fetchDesign } from "@/lib/study/service/design";
import { listReviews } from "@/lib/study/service/review";
import { designSummary } from "@/lib/study/summary/designSummary";
import { studyDesignSchema } from "@/lib/study/design";
import { protocolChanges } from "@/lib/study/protocolChanges";
import { listProtocolVersions } from "@/lib/study/service/protocol";
import { ProtocolChangesView } from "@/components/study/ProtocolChangesView";
import { ConsentChecklistView } from "@/components/study/ConsentChecklistView";
import { ConsentMarkdown } from "@/components/study/ConsentMarkdown";
import { DecisionForm } from "@/components/study/DecisionForm";
import { DiffView } from "@/components/study/DiffView";
import { StatusBadge } from "@/components/ui/StatusBadge";

export const metadata = { title: "Protocol review" };

/** The reviewer's read-only view of a protocol: summary, design, consent (with the diff to the last approved version), documents, decision. */
export default async function ReviewStudyPage({ params }: { params: Promise<{ id: string }> }) {
  const user = requireRole(await getCurrentUser(), "reviewer");
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id <= 0) notFound();
  let study;
  try {
    ({ study } = await assertCanViewStudy(db, user, id));
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
  const [stored, versions, reviews, documents, protocol] = await Promise.all([fetchDesign(db, id), listConsentVersions(db, id), listReviews(db, id), listDocuments(db, id), listProtocolVersions(db, id)]);
  const open = reviews.find((r) => r.status === "submitted");
  const consent = versions.find((v) => v.id === (open ?? reviews[0])?.consentVersionId) ?? versions[0];
  const approved = await latestApprovedConsent(db, id);
  const baseline = approved && consent && approved.id !== consent.id ? approved : null;
  // what the reviewer decides on: the submission waiting, else the version in force (never the team's unsubmitted edits)
  const openVersion = protocol.find((v) => v.status === "submitted") ?? null;
  const inForce = protocol.find((v) => v.status === "approved") ?? null;
  const shown = openVersion ?? inForce;
  const parsedShown = shown ? studyDesignSchema.safeParse(shown.design) : null;
  const shownDesign = parsedShown?.success ? parsedShown.data : stored.design;
  const summary = shownDesign ? designSummary(shownDesign) : null;
  return (
    <article className="space-y-5">
      <div className="flex flex-wrap items-center gap-3"><h1>{study.title}</h1><StatusBadge status={study.status} /></div>
      <p className="text-sm"><Link href={`/api/studies/${id}/consent-register`}>Consent register (CSV)</Link> · <Link href={`/review/audit?study=${id}`}>Audit trail of this study</Link></p>
      <section className="space-y-1">
        <h2>Protocol summary</h2>
        <p className="text-sm">Ethics protocol: {study.protocolNumber ?? "not given"}</p>
        <p className="max-w-prose whitespace-pre-line text-sm">{shown ? shown.summary : study.summary}</p>
        {shown && <p className="text-sm">Protocol version {shown.version} ({shown.status === "submitted" ? "waiting for your decision" : "in force"}){inForce && openVersion ? `; version ${inForce.version} is in force` : ""}.</p>}
        {summary && shownDesign && (
          <ul className="text-sm">
            <li>Conditions: {summary.conditions.map((c) => c.label).join("; ")}</li>
            <li>Task: {shownDesign.task.type === "ring" ? "multi-directional ring" : "one-directional"}, {shownDesign.task.displayMode} mode, A = {shownDesign.task.amplitudes.join(", ")}, W = {shownDesign.task.widths.join(", ")} {shownDesign.task.unit}</li>
            <li>{summary.trialsPerParticipant} trials per participant, about {summary.estimatedMinutes} minutes, minimum break {shownDesign.minBreakSeconds} s; planned N = {shownDesign.plannedParticipants}; counterbalancing: {shownDesign.counterbalancing.method}</li>
            <li>Compensation: {shownDesign.compensation || "none stated"}</li>
            <li>Design fingerprint: <code className="text-xs">{shown?.designHash ?? stored.designHash}</code></li>
            <li>Erasure on request: {shown?.erasureWindowDays ? `within ${shown.erasureWindowDays} days after the session` : "no time limit stated"}</li>
          </ul>
        )}
      </section>
      {consent && (
        <section className="space-y-2">
          <h2>Consent version {consent.version} ({consent.status})</h2>
          <p className="text-xs">SHA-256 of the frozen text: <code className="break-all">{consent.sha256 ?? "not frozen"}</code></p>
          <div className="card"><ConsentMarkdown text={consent.body} /></div>
          <ConsentChecklistView items={consentChecklist(consent.body)} />
          {baseline ? (
            <div className="space-y-1"><h3 className="font-semibold">Changes since the last approved version ({baseline.version})</h3><DiffView label="Diff to the last approved version" parts={consentDiff(baseline.body, consent.body)} /></div>
          ) : (
            <p className="text-sm">No earlier approved version to compare with.</p>
          )}
        </section>
      )}
      {openVersion && inForce && (
        <section className="space-y-2">
          <h2>Amendment: changes since the approved version {inForce.version}</h2>
          <ProtocolChangesView changes={protocolChanges(inForce, openVersion)} baseline={`the approved version ${inForce.version}`} />
        </section>
      )}
      {shown?.invitationText && (
        <section className="space-y-1">
          <h2>Invitation text</h2>
          <p className="card max-w-prose whitespace-pre-line text-sm">{shown.invitationText}</p>
        </section>
      )}
      <section className="space-y-2">
        <h2>Documents</h2>
        {documents.length === 0 ? <p className="text-sm">No documents.</p> : (
          <ul className="text-sm">{documents.map((d) => <li key={d.id}><a href={`/api/documents/${d.id}`}>{d.filename}</a> ({d.kind.replace("_", " ")}, {(d.sizeBytes / 1024).toFixed(1)} kB, SHA-256 <code className="text-xs">{d.sha256.slice(0, 16)}…</code>)</li>)}</ul>
        )}
      </section>
      {open ? <DecisionForm studyId={id} /> : <p className="notice">No submission is waiting for a decision.</p>}
      <section className="space-y-2">
        <h2>Review history</h2>
        <table><thead><tr><th>Submitted</th><th>Consent version</th><th>Decision</th><th>Reviewer</th><th>Comment</th></tr></thead>
          <tbody>{reviews.map((r) => <tr key={r.id}><td>{r.submittedAt.toISOString().slice(0, 16).replace("T", " ")}</td><td>{r.consentVersion}</td><td>{r.status === "submitted" ? "waiting" : r.status}</td><td>{r.decidedBy ?? "—"}</td><td>{r.comment ?? "—"}</td></tr>)}</tbody>
        </table>
      </section>
    </article>
  );
}
