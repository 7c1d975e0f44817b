import { db } from "@/lib/db";
import { listParticipants, recruitmentBlocker, recruitmentState } from "@/lib/recruitment/service";
import { RecruitmentPanel } from "@/components/study/RecruitmentPanel";
import { studyForPage } from "../access";

export const metadata = { title: "Recruitment" };

const STATUS: Record<string, string> = { invited: "Invited", consented: "Consented", in_progress: "In progress", completed: "Completed", withdrawn: "Withdrawn" };

export default async function RecruitmentPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner } = await studyForPage((await params).id);
  const [state, blocker, participants] = await Promise.all([recruitmentState(db, study.id), recruitmentBlocker(db, study.id), listParticipants(db, study.id)]);
  return (
    <div className="space-y-4">
      {!["approved", "recruiting"].includes(study.status) && <p className="notice">Recruitment opens only after the ethics review approves the study (it is {study.status.replace("_", " ")}).</p>}
      <RecruitmentPanel studyId={study.id} status={study.status} isOwner={isOwner} canEdit={canEdit} cap={state.participantCap} publicLink={state.publicLink} blocker={blocker} />
      <section className="space-y-2">
        <h2>Participants ({participants.length}{state.participantCap !== null ? ` of at most ${state.participantCap}` : ""})</h2>
        <table aria-label="Participants"><thead><tr><th>Code</th><th>Source</th><th>Status</th><th>Invited</th><th>Consented</th><th>Completed</th></tr></thead>
          <tbody>{participants.map((p) => <tr key={p.code}><td>{p.code}</td><td>{p.source}</td><td>{STATUS[p.status]}</td><td>{p.createdAt.toISOString().slice(0, 10)}</td><td>{p.consentedAt?.toISOString().slice(0, 10) ?? "—"}</td><td>{p.completedAt?.toISOString().slice(0, 10) ?? "—"}</td></tr>)}</tbody>
        </table>
      </section>
    </div>
  );
}
