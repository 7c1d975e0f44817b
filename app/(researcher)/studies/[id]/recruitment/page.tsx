import Link from "next/link";
import { db } from "@/lib/db";
import { qrDataUrl } from "@/lib/links";
import { listInvitations, listParticipants, recruitmentBlocker, recruitmentState } from "@/lib/recruitment/service";
import { editLock, fetchInForceVersion, fetchWorkingCopy } from "@/lib/study/service/protocol";
import { InvitationsTable } from "@/components/study/InvitationsTable";
import { InvitationText } from "@/components/study/InvitationText";
import { RecruitmentPanel } from "@/components/study/RecruitmentPanel";
import { RecruitmentSettings } from "@/components/study/RecruitmentSettings";
import { studyForPage } from "../access";

export const metadata = { title: "Recruitment" };

const STATUS: Record<string, string> = { completed: "completed", in_progress: "in progress", consented: "consented", invited: "not started", withdrawn: "withdrawn" };
const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : null);

/** "7 participants: 1 completed, 1 in progress, …" (real participants; pilots are on the Participants page). */
function statusCounts(participants: { status: string }[]): string {
  if (participants.length === 0) return "No participants yet.";
  const parts = Object.entries(STATUS).map(([k, label]) => [participants.filter((p) => p.status === k).length, label] as const).filter(([n]) => n > 0);
  return `${participants.length} participant(s): ${parts.map(([n, label]) => `${n} ${label}`).join(", ")}.`;
}

export default async function RecruitmentPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner, teamRole } = await studyForPage((await params).id);
  const [state, blocker, participants, invitations, working, inForce, lock] = await Promise.all([
    recruitmentState(db, study.id), recruitmentBlocker(db, study.id), listParticipants(db, study.id), teamRole ? listInvitations(db, study.id, isOwner) : Promise.resolve([]),
    fetchWorkingCopy(db, study.id), fetchInForceVersion(db, study.id), editLock(db, study, "invitation text"),
  ]);
  const publicQr = isOwner && state.publicLink ? await qrDataUrl(state.publicLink) : null;
  return (
    <div className="space-y-4">
      {!["approved", "recruiting"].includes(study.status) && <p className="notice">Recruitment opens only after the ethics review approves the study (it is {study.status.replace("_", " ")}).</p>}
      <RecruitmentPanel studyId={study.id} status={study.status} isOwner={isOwner} canEdit={canEdit} cap={state.participantCap} publicLink={state.publicLink} publicQr={publicQr} blocker={blocker} />
      {isOwner && <RecruitmentSettings studyId={study.id} initial={state} publicLink={state.publicLink} />}
      {canEdit && <InvitationText studyId={study.id} initial={working.invitationText ?? ""} approved={inForce ? inForce.invitationText ?? "" : null} locked={lock} />}
      {teamRole && (
        <InvitationsTable studyId={study.id} canEdit={canEdit} isOwner={isOwner} recruiting={study.status === "recruiting"}
          rows={invitations.map((i) => ({ participantId: i.participantId, code: i.code, source: i.source, status: i.status, created: day(i.createdAt)!, sentCount: i.sentCount, lastSent: day(i.lastSentAt), revoked: i.revokedAt !== null, email: i.email }))} />
      )}
      <section className="space-y-1" data-testid="participant-counts">
        <h2>Participants</h2>
        <p className="text-sm">{statusCounts(participants)}{state.participantCap !== null ? ` The cap of ${state.participantCap} counts those who completed or are taking part.` : ""}</p>
        {teamRole && <p className="text-sm">The <Link href={`/studies/${study.id}/participants`}>Participants</Link> page lists each one with their stage, device check, completion code and protocol version.</p>}
      </section>
    </div>
  );
}
