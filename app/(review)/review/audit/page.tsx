import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchAuditHead, listAudit } from "@/lib/data/audit";
import { keptHeadLine, listPublishedHeads } from "@/lib/data/auditHeads";
import { getCurrentUser } from "@/lib/session";
import { AuditDetails } from "./AuditDetails";
import { VerifyButton } from "./VerifyButton";

export const metadata = { title: "Audit trail" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<{ study?: string }> }) {
  requireRole(await getCurrentUser(), "reviewer");
  const raw = Number((await searchParams).study);
  const studyId = Number.isInteger(raw) && raw > 0 ? raw : undefined;
  const [entries, head, published] = await Promise.all([listAudit(db, { limit: 200, studyId }), fetchAuditHead(db), listPublishedHeads(db, 14)]);
  return (
    <section className="space-y-4">
      <h1>Audit trail</h1>
      <p className="max-w-prose text-sm text-slate-700">
        Every consequential action, newest first. Each entry carries a keyed hash (HMAC-SHA-256, with a key the database does not hold) of the
        previous entry and its own content, so an edited, inserted or deleted entry breaks the chain. Each day the chain&apos;s head is mailed to
        the ethics reviewers: keep those mails (or download the head below), and paste them here to check that nothing up to them was changed
        or removed later, even by someone with full access to the database.
      </p>
      <p className="text-sm">Head now: entry {head.lastId} of {head.entries}, <code className="break-all text-xs">{keptHeadLine(head)}</code> · <a href="/api/audit/head" download>Download this head</a></p>
      {published.length > 0 && (
        <details className="text-sm">
          <summary>Heads published on the last {published.length} days</summary>
          <ul className="mt-1 font-mono text-xs">{published.map((p) => <li key={p.day}>{p.day} {keptHeadLine(p)}</li>)}</ul>
        </details>
      )}
      <VerifyButton />
      <form className="flex items-end gap-2" method="get">
        <div><label htmlFor="audit-study">Study number</label><input id="audit-study" name="study" className="input w-32" inputMode="numeric" defaultValue={studyId ?? ""} /></div>
        <button className="btn-secondary">Show this study only</button>
        {studyId !== undefined && <a href="/review/audit">Show every study</a>}
      </form>
      <div className="card overflow-x-auto p-0">
        <table aria-label="Audit trail">
          <thead><tr><th>#</th><th>Time (UTC)</th><th>Who</th><th>Action</th><th>Study</th><th>Details</th><th>Hash</th></tr></thead>
          <tbody>
            {entries.map((e) => (
              <tr key={e.id}>
                <td>{e.id}</td><td>{e.at.toISOString().replace("T", " ").slice(0, 19)}</td><td>{e.actor}</td><td>{e.action}</td><td>{e.studyId ?? "—"}</td>
                <td><AuditDetails details={e.details} /></td>
                <td><code className="text-xs">{e.hash.slice(0, 12)}…</code></td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
