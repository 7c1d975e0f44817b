import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { listAudit } from "@/lib/data/audit";
import { getCurrentUser } from "@/lib/session";
import { VerifyButton } from "./VerifyButton";

export const metadata = { title: "Audit trail" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<{ study?: string }> }) {
  requireRole(await getCurrentUser(), "reviewer");
  const raw = Number((await searchParams).study);
  const studyId = Number.isInteger(raw) && raw > 0 ? raw : undefined;
  const entries = await listAudit(db, { limit: 200, studyId });
  return (
    <section className="space-y-4">
      <h1>Audit trail</h1>
      <p className="max-w-prose text-sm text-slate-700">Every consequential action, newest first. Each entry carries the SHA-256 of the previous entry and its own content, so an edited or deleted entry breaks the chain.</p>
      <VerifyButton />
      <form className="flex items-end gap-2" method="get">
        <div><label htmlFor="audit-study">Study number</label><input id="audit-study" name="study" className="input w-32" inputMode="numeric" defaultValue={studyId ?? ""} /></div>
        <button className="btn-secondary">Show this study only</button>
        {studyId !== undefined && <a href="/review/audit">Show every study</a>}
      </form>
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
