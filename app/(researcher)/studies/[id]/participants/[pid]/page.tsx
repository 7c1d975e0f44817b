import Link from "next/link";
import { notFound } from "next/navigation";
import { ParticipantDetail } from "@/components/results/ParticipantDetail";
import { SequenceExclusions } from "@/components/study/SequenceExclusions";
import { db } from "@/lib/db";
import { listExclusions, sequenceCandidates } from "@/lib/data/exclusions";
import { assertStudyTeam, fetchStudyDesign, fetchStudyParticipant } from "@/lib/data/results";
import { AppError } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Participant" };

export default async function ParticipantPage({ params }: { params: Promise<{ id: string; pid: string }> }) {
  const p = await params;
  const id = Number(p.id), pid = Number(p.pid);
  if (!Number.isInteger(id) || id <= 0 || !Number.isInteger(pid) || pid <= 0) notFound();
  let teamRole;
  try {
    ({ teamRole } = await assertStudyTeam(db, await getCurrentUser(), id));
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
  const participant = await fetchStudyParticipant(db, id, pid);
  if (!participant) notFound();
  const design = await fetchStudyDesign(db, id);
  const [sequences, exclusions] = await Promise.all([sequenceCandidates(db, id, pid, design), listExclusions(db, id, { participantId: pid })]);
  const whole = exclusions.find((e) => e.scope === "participant");
  return (
    <article className="space-y-4">
      <p className="text-sm print:hidden"><Link href={`/studies/${id}/participants`}>← Participants</Link> · <Link href={`/studies/${id}/results`}>Results</Link></p>
      <h1>Participant {participant.code}</h1>
      <SequenceExclusions studyId={id} participantId={pid} code={participant.code} sequences={sequences} participantExclusion={whole ? { id: whole.id, reason: whole.reason } : null} canEdit={teamRole !== "viewer"} />
      <ParticipantDetail studyId={id} participantId={pid} />
    </article>
  );
}
