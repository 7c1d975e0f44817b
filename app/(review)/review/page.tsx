import Link from "next/link";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchStudiesApprovedBy, fetchStudiesInReview } from "@/lib/data/studies";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Review queue" };

export default async function ReviewQueuePage() {
  const reviewer = requireRole(await getCurrentUser(), "reviewer");
  const [studies, approved] = await Promise.all([fetchStudiesInReview(db), fetchStudiesApprovedBy(db, reviewer.id)]);
  return (
    <section className="space-y-4">
      <h1>Review queue</h1>
      <p className="max-w-prose text-sm text-slate-700">Protocols and consent versions waiting for a decision, oldest first. Decisions follow your ethics board's procedures; Yawpoint records them.</p>
      {studies.length === 0 ? (
        <p className="text-sm">Nothing is waiting for review.</p>
      ) : (
        <div className="card overflow-x-auto p-0">
          <table aria-label="Review queue">
            <thead><tr><th>Study</th><th>Protocol</th><th>Researcher</th><th>Submission</th><th>Submitted</th></tr></thead>
            <tbody>
              {studies.map((s) => (
                <tr key={s.id}><td><Link href={`/review/studies/${s.id}`}>{s.title}</Link></td><td>{s.protocolNumber ?? "—"}</td><td>{s.ownerName}</td><td>{s.amendment ? `amendment (version ${s.protocolVersion ?? "?"})` : "first review"}</td><td>{(s.submittedAt ?? s.updatedAt).toISOString().slice(0, 10)}</td></tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <h2>Studies you approved</h2>
      {approved.length === 0 ? (
        <p className="text-sm">You have not approved any study yet.</p>
      ) : (
        <div className="card overflow-x-auto p-0">
          <table aria-label="Studies you approved">
            <thead><tr><th>Study</th><th>Protocol</th><th>Researcher</th><th>Status now</th><th>Versions you approved</th><th>In force</th><th>Completed participants</th><th>Audit</th></tr></thead>
            <tbody>
              {approved.map((s) => (
                <tr key={s.id}>
                  <td><Link href={`/review/studies/${s.id}`}>{s.title}</Link></td><td>{s.protocolNumber ?? "—"}</td><td>{s.ownerName}</td>
                  <td>{s.status.replace("_", " ")}{s.amendmentWaiting ? "; an amendment waits" : ""}</td>
                  <td>{s.versionsApproved.join(", ")} (last {s.lastApprovedAt.toISOString().slice(0, 10)})</td><td>{s.inForceVersion ?? "—"}</td><td>{s.completed}</td>
                  <td><Link href={`/review/audit?study=${s.id}`}>trail</Link></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
