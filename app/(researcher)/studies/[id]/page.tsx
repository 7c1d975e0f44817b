import Link from "next/link";
import { db } from "@/lib/db";
import { fetchDesign } from "@/lib/study/service/design";
import { listTeam } from "@/lib/study/service/meta";
import { fetchOpenReview, pendingAmendment } from "@/lib/study/service/protocol";
import { designSummary } from "@/lib/study/summary/designSummary";
import { CloneButton } from "@/components/study/CloneButton";
import { PilotPanel } from "@/components/study/PilotPanel";
import { StudyMetaForm, TeamForm } from "@/components/study/StudyMetaForm";
import { studyForPage } from "./access";

export default async function StudyOverviewPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner, teamRole } = await studyForPage((await params).id);
  const [team, stored, pending, open] = await Promise.all([listTeam(db, study.id), fetchDesign(db, study.id), pendingAmendment(db, study.id), fetchOpenReview(db, study.id)]);
  const summary = stored.design ? designSummary(stored.design) : null;
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold">Ethics protocol</dt><dd>{study.protocolNumber ?? "not yet assigned"}</dd>
        <dt className="font-semibold">Design</dt><dd>{summary ? `${summary.conditions.length} conditions, ${summary.trialsPerParticipant} trials, about ${summary.estimatedMinutes} minutes per participant` : "not saved yet"}</dd>
        <dt className="font-semibold">Protocol version</dt>
        <dd data-testid="protocol-status">
          {pending.inForce ? `version ${pending.inForce.version} in force (approved ${pending.inForce.decidedAt?.toISOString().slice(0, 10) ?? "—"})` : "none approved yet"}
          {open && pending.inForce ? `; amendment (version ${open.version}) in review` : ""}
          {!open && pending.changes.length > 0 ? <>; unsubmitted changes to the {pending.changes.map((c) => c.part).join(", ")}: <Link href={`/studies/${study.id}/review`}>submit the amendment</Link></> : ""}
        </dd>
      </dl>
      <p className="max-w-prose whitespace-pre-line text-sm">{study.summary}</p>
      {canEdit && <StudyMetaForm studyId={study.id} initial={{ title: study.title, summary: study.summary, protocolNumber: study.protocolNumber }} inForceVersion={pending.inForce?.version ?? null} />}
      {canEdit && stored.design && <PilotPanel studyId={study.id} realParticipantsPossible={!["draft", "in_review"].includes(study.status)} />}
      {canEdit && !stored.design && <p className="notice max-w-prose" data-testid="pilot-needs-design">Pilots (yourself, on a phone, or simulated participants) open here once a design is saved: see the <Link href={`/studies/${study.id}/design`}>Design</Link> tab.</p>}
      <section className="space-y-2">
        <h2>Team</h2>
        <table className="max-w-xl"><thead><tr><th>Name</th><th>E-mail</th><th>Role</th></tr></thead>
          <tbody>{team.map((m) => <tr key={m.userId}><td>{m.name}</td><td>{m.email}</td><td>{m.role}</td></tr>)}</tbody>
        </table>
        {isOwner && <TeamForm studyId={study.id} />}
      </section>
      {teamRole && <CloneButton studyId={study.id} />}
    </div>
  );
}
