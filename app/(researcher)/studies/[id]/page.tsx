import { db } from "@/lib/db";
import { fetchDesign } from "@/lib/study/service/design";
import { listTeam } from "@/lib/study/service/meta";
import { designSummary } from "@/lib/study/summary/designSummary";
import { StudyMetaForm, TeamForm } from "@/components/study/StudyMetaForm";
import { studyForPage } from "./access";

export default async function StudyOverviewPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner } = await studyForPage((await params).id);
  const [team, stored] = await Promise.all([listTeam(db, study.id), fetchDesign(db, study.id)]);
  const summary = stored.design ? designSummary(stored.design) : null;
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold">Ethics protocol</dt><dd>{study.protocolNumber ?? "not yet assigned"}</dd>
        <dt className="font-semibold">Design</dt><dd>{summary ? `${summary.conditions.length} conditions, ${summary.trialsPerParticipant} trials, about ${summary.estimatedMinutes} minutes per participant` : "not saved yet"}</dd>
      </dl>
      <p className="max-w-prose whitespace-pre-line text-sm">{study.summary}</p>
      {canEdit && <StudyMetaForm studyId={study.id} initial={{ title: study.title, summary: study.summary, protocolNumber: study.protocolNumber }} />}
      <section className="space-y-2">
        <h2>Team</h2>
        <table className="max-w-xl"><thead><tr><th>Name</th><th>E-mail</th><th>Role</th></tr></thead>
          <tbody>{team.map((m) => <tr key={m.userId}><td>{m.name}</td><td>{m.email}</td><td>{m.role}</td></tr>)}</tbody>
        </table>
        {isOwner && <TeamForm studyId={study.id} />}
      </section>
    </div>
  );
}
