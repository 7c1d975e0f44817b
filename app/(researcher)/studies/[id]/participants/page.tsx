import { db } from "@/lib/db";
import { fetchParticipantList, type ParticipantListEntry } from "@/lib/data/participantList";
import { EraseByCode } from "@/components/study/EraseByCode";
import { ParticipantsTable, type ParticipantTableRow } from "@/components/study/ParticipantsTable";
import { fetchInForceVersion } from "@/lib/study/service/protocol";
import { studyForPage } from "../access";

export const metadata = { title: "Participants" };
export const dynamic = "force-dynamic";

const toRow = (p: ParticipantListEntry): ParticipantTableRow => ({
  id: p.id, code: p.code, kind: p.kind, included: p.included, source: p.source, status: p.status, stage: p.stage, deviceVerdict: p.deviceVerdict,
  device: p.deviceClass || p.browser || p.os ? [p.deviceClass, p.browser, p.os].map((x) => x ?? "—").join(" · ") : "—",
  sensor: p.sensorSource ? `${p.sensorSource}${p.sampleRateHz !== null ? `, ${Math.round(p.sampleRateHz)} Hz` : ""}` : "—",
  completionCode: p.completionCode, revoked: p.revoked, protocolVersion: p.protocolVersion, row: p.row, place: p.place, exclusion: p.exclusion, exclusionId: p.exclusionId,
  excludedSequences: p.excludedSequences, flags: p.flags, lastActivity: p.lastActivityAt ? p.lastActivityAt.toISOString().slice(0, 16).replace("T", " ") : "—", panelId: p.panelId,
});

/** Every participant of the study (team): real ones, and apart from them the pilots and simulated participants. */
export default async function ParticipantsPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit, isOwner, teamRole } = await studyForPage((await params).id);
  if (!teamRole) return <p className="notice">Only the study&apos;s team sees its participants.</p>;
  const [all, inForce] = await Promise.all([fetchParticipantList(db, study.id, { isOwner }), fetchInForceVersion(db, study.id)]);
  const real = all.filter((p) => p.kind === "real").map(toRow);
  const pilots = all.filter((p) => p.kind !== "real").map(toRow);
  return (
    <div className="space-y-5">
      <section className="space-y-2">
        <h2>Participants ({real.length})</h2>
        <p className="max-w-prose text-sm">Codes are pseudonyms. Data-quality warnings suggest candidates for exclusion; an exclusion keeps the data stored, leaves it out of results and archives, and is reported there with its reason. {isOwner ? "Panel ids are shown to you as the owner, for matching payments; they never leave in an archive." : ""}</p>
        <ParticipantsTable studyId={study.id} rows={real} canEdit={canEdit} pilots={false} showPanel={isOwner && real.some((r) => r.panelId !== null)} />
      </section>
      {isOwner && <EraseByCode studyId={study.id} windowDays={inForce?.erasureWindowDays ?? null} />}
      <section className="space-y-2">
        <h2>Pilots and simulated participants ({pilots.length})</h2>
        <p className="max-w-prose text-sm">Kept apart from real participants: they take no place and stay out of results and archives unless included.</p>
        <ParticipantsTable studyId={study.id} rows={pilots} canEdit={canEdit} pilots showPanel={false} />
      </section>
    </div>
  );
}
