import Link from "next/link";
import { UploadTrialTable } from "@/components/analysis/UploadTrialTable";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchImportsOf } from "@/lib/data/imports";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Analyse a trial table" };

export default async function AnalysesPage() {
  const user = requireRole(await getCurrentUser(), "researcher");
  const imports = await fetchImportsOf(db, user.id);
  return (
    <section className="space-y-6">
      <h1>Analyse a trial table</h1>
      <p className="max-w-prose text-sm text-slate-700">
        Bring data from elsewhere: one row per movement with the columns participant, condition, block, sequence, trial, amplitude, width,
        from_x/y, to_x/y, start_x/y, end_x/y, time_ms, hit and optional f_NAME factor columns (see docs/analysis.md). The same analysis runs on the command line with npm run analyze.
      </p>
      <div className="card"><UploadTrialTable /></div>
      <div className="card overflow-x-auto p-0">
        <table>
          <thead><tr><th>File</th><th>Uploaded</th><th>Size</th><th>SHA-256</th><th>Options</th></tr></thead>
          <tbody>
            {imports.length === 0 && <tr><td colSpan={5}>No imports yet.</td></tr>}
            {imports.map((i) => (
              <tr key={i.id}>
                <td><Link href={`/analyses/${i.id}`}>{i.filename}</Link></td>
                <td>{i.createdAt.toISOString().replace("T", " ").slice(0, 16)}</td>
                <td>{(i.sizeBytes / 1024).toFixed(1)} KB</td>
                <td><code className="text-xs">{i.sha256.slice(0, 16)}…</code></td>
                <td>{i.options.start}, {i.options.exclude}, {i.options.unit}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
