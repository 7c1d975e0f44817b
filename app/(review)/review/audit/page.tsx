import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { listAudit } from "@/lib/data/audit";
import { getCurrentUser } from "@/lib/session";
import { VerifyButton } from "./VerifyButton";

export const metadata = { title: "Audit trail" };

export default async function AuditPage() {
  requireRole(await getCurrentUser(), "reviewer");
  const entries = await listAudit(db, { limit: 200 });
  return (
    <section className="space-y-4">
      <h1>Audit trail</h1>
      <p className="max-w-prose text-sm text-slate-700">Every consequential action, newest first. Each entry carries the SHA-256 of the previous entry and its own content, so an edited or deleted entry breaks the chain.</p>
      <VerifyButton />
      <div className="card overflow-x-auto p-0">
        <table>
          <thead><tr><th>#</th><th>Time (UTC)</th><th>Who</th><th>Action</th><th>Study</th><th>Hash</th></tr></thead>
          <tbody>
            {entries.map((e) => (
              <tr key={e.id}>
                <td>{e.id}</td><td>{e.at.toISOString().replace("T", " ").slice(0, 19)}</td><td>{e.actor}</td><td>{e.action}</td><td>{e.studyId ?? "—"}</td>
                <td><code className="text-xs">{e.hash.slice(0, 12)}…</code></td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
