import { notFound } from "next/navigation";
import { assertCanViewStudy, requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { fetchMonitor } from "@/lib/data/participants";
import { fetchParticipantList } from "@/lib/data/participantList";
import { describeInputDetails } from "@/lib/runner/inputDetails";
import { getCurrentUser } from "@/lib/session";
import { AutoRefresh } from "./AutoRefresh";

export const dynamic = "force-dynamic";

/** Live monitor of a study's sessions (refreshes every 10 s). */
export default async function MonitorPage({ params }: { params: Promise<{ id: string }> }) {
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id <= 0) notFound();
  let title: string;
  try {
    const user = requireRole(await getCurrentUser(), "researcher");
    title = (await assertCanViewStudy(db, user, id)).study.title;
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
  const [sessions, list] = await Promise.all([fetchMonitor(db, id), fetchParticipantList(db, id, { isOwner: false })]);
  const detail = new Map(list.map((p) => [p.id, p]));
  const open = sessions.filter((s) => s.status === "consented" || s.status === "in_progress");
  // refused by the device check: they cannot go on with this device, so they are not "in progress"
  const refused = open.filter((s) => detail.get(s.id)?.deviceVerdict === "refused").length;
  const active = open.length - refused;
  return (
    <article className="space-y-3">
      <h1>Live sessions: {title}</h1>
      <p className="text-sm" data-testid="monitor-counts">{active} in progress, {refused > 0 ? `${refused} refused at the device check, ` : ""}{sessions.length} started in total. <AutoRefresh seconds={10} /></p>
      <table className="w-full text-sm" aria-label="Live sessions">
        <thead>
          <tr className="text-left">
            <th>Participant</th><th>Status</th><th>Stage</th><th>Device check</th><th>Last activity</th><th>Rounds stored</th><th>Sensor rate</th><th>Input</th><th>Error rate</th><th>Data quality</th>
          </tr>
        </thead>
        <tbody>
          {sessions.map((s) => (
            <tr key={s.code} className="border-t border-slate-200 align-top">
              <td><a className="font-mono" href={`/studies/${id}/participants/${s.id}`}>{s.code}</a>{s.kind !== "real" ? ` (${s.kind})` : ""}</td>
              <td>{s.status.replace("_", " ")}</td>
              <td>{detail.get(s.id)?.stage ?? "—"}</td>
              <td>{detail.get(s.id)?.deviceVerdict ?? "—"}</td>
              <td>{s.lastActivityAt ? s.lastActivityAt.toISOString().replace("T", " ").slice(0, 19) + " UTC" : "—"}</td>
              <td>{s.sequencesStored}{s.sequencesPlanned !== null ? ` of ${s.sequencesPlanned}` : ""}</td>
              <td>{s.sampleRateHz !== null ? `${Math.round(s.sampleRateHz)} Hz` : "—"}</td>
              <td data-testid="input-details">{s.inputs ? describeInputDetails(s.inputs) : "—"}</td>
              <td>{s.errorRate !== null ? `${(100 * s.errorRate).toFixed(1)} %` : "—"}</td>
              <td>{s.flags.length === 0 ? "no warnings" : <ul className="list-disc pl-4">{s.flags.map((f) => <li key={f}>warning: {f}</li>)}</ul>}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {sessions.length === 0 && <p className="notice">No participant has started yet.</p>}
    </article>
  );
}
