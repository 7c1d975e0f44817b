import Link from "next/link";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchStudiesInReview } from "@/lib/data/studies";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Review queue" };

export default async function ReviewQueuePage() {
  requireRole(await getCurrentUser(), "reviewer");
  const studies = await fetchStudiesInReview(db);
  return (
    <section className="space-y-4">
      <h1>Review queue</h1>
      <p className="max-w-prose text-sm text-slate-700">Protocols and consent versions waiting for a decision, oldest first. Decisions follow your ethics board's procedures; Yawpoint records them.</p>
      {studies.length === 0 ? (
        <p className="text-sm">Nothing is waiting for review.</p>
      ) : (
        <div className="card overflow-x-auto p-0">
          <table>
            <thead><tr><th>Study</th><th>Protocol</th><th>Researcher</th><th>Submitted</th></tr></thead>
            <tbody>
              {studies.map((s) => (
                <tr key={s.id}><td><Link href={`/review/studies/${s.id}`}>{s.title}</Link></td><td>{s.protocolNumber ?? "—"}</td><td>{s.ownerName}</td><td>{s.updatedAt.toISOString().slice(0, 10)}</td></tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
