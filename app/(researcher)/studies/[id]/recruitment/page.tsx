import { db } from "@/lib/db";
import { listInvitations, listParticipants, recruitmentBlocker, recruitmentState } from "@/lib/recruitment/service";
import { editLock, fetchInForceVersion, fetchWorkingCopy } from "@/lib/study/service/protocol";
import { InvitationsTable } from "@/components/study/InvitationsTable";
import { InvitationText } from "@/components/study/InvitationText";
import { RecruitmentPanel } from "@/components/study/RecruitmentPanel";
import { RecruitmentSettings } from "@/components/study/RecruitmentSettings";
import { studyForPage } from "../access";

export const metadata = { title: "Recruitment" };

const STATUS: Record<string, string> = { invited: "Invited", consented: "Consented", in_progress: "In progress", completed: "Completed", withdrawn: "Withdrawn" };
const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : null);

export default async function RecruitmentPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner, teamRole } = await studyForPage((await params).id);
  const [state, blocker, participants, invitations, working, inForce, lock] = await Promise.all([
    recruitmentState(db, study.id), recruitmentBlocker(db, study.id), listParticipants(db, study.id), teamRole ? listInvitations(db, study.id, isOwner) : Promise.resolve([]),
    fetchWorkingCopy(db, study.id), fetchInForceVersion(db, study.id), editLock(db, study, "invitation text"),
  ]);
  return (
    <div className="space-y-4">
      {!["approved", "recruiting"].includes(study.status) && <p className="notice">Recruitment opens only after the ethics review approves the study (it is {study.status.replace("_", " ")}).</p>}
      <RecruitmentPanel studyId={study.id} status={study.status} isOwner={isOwner} canEdit={canEdit} cap={state.participantCap} publicLink={state.publicLink} blocker={blocker} />
      {isOwner && <RecruitmentSettings studyId={study.id} initial={state} publicLink={state.publicLink} />}
      {canEdit && <InvitationText studyId={study.id} initial={working.invitationText ?? ""} approved={inForce ? inForce.invitationText ?? "" : null} locked={lock} />}
      {teamRole && (
        <InvitationsTable studyId={study.id} canEdit={canEdit} isOwner={isOwner} recruiting={study.status === "recruiting"}
          rows={invitations.map((i) => ({ participantId: i.participantId, code: i.code, source: i.source, status: i.status, created: day(i.createdAt)!, sentCount: i.sentCount, lastSent: day(i.lastSentAt), revoked: i.revokedAt !== null, email: i.email }))} />
      )}
      <section className="space-y-2">
        <h2>Participants ({participants.length}{state.participantCap !== null ? `; the cap of ${state.participantCap} counts those who completed or are taking part` : ""})</h2>
        <table aria-label="Participants"><thead><tr><th>Code</th><th>Source</th><th>Status</th><th>Invited</th><th>Consented</th><th>Completed</th></tr></thead>
          <tbody>{participants.map((p) => <tr key={p.code}><td>{p.code}</td><td>{p.source}</td><td>{STATUS[p.status]}</td><td>{p.createdAt.toISOString().slice(0, 10)}</td><td>{p.consentedAt?.toISOString().slice(0, 10) ?? "—"}</td><td>{p.completedAt?.toISOString().slice(0, 10) ?? "—"}</td></tr>)}</tbody>
        </table>
      </section>
    </div>
  );
}
