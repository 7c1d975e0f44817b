import Link from "next/link";
import { notFound } from "next/navigation";
import { ParticipantDetail } from "@/components/results/ParticipantDetail";
import { db } from "@/lib/db";
import { assertStudyTeam, fetchStudyParticipant } from "@/lib/data/results";
import { AppError } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Participant · Yawpoint" };

export default async function ParticipantPage({ params }: { params: Promise<{ id: string; pid: string }> }) {
  const p = await params;
  const id = Number(p.id), pid = Number(p.pid);
  if (!Number.isInteger(id) || id <= 0 || !Number.isInteger(pid) || pid <= 0) notFound();
  try {
    await assertStudyTeam(db, await getCurrentUser(), id);
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
  const participant = await fetchStudyParticipant(db, id, pid);
  if (!participant) notFound();
  return (
    <article className="space-y-4">
      <p className="text-sm print:hidden"><Link href={`/studies/${id}/results`}>← Results</Link></p>
      <h1>Participant {participant.code}</h1>
      <ParticipantDetail studyId={id} participantId={pid} />
    </article>
  );
}
