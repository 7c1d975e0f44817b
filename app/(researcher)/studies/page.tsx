import Link from "next/link";
import { db } from "@/lib/db";
import { fetchStudiesForMember } from "@/lib/data/studies";
import { getCurrentUser } from "@/lib/session";
import { requireRole } from "@/lib/auth/guards";
import { StatusBadge } from "@/components/ui/StatusBadge";

export const metadata = { title: "Studies" };

export default async function StudiesPage() {
  const user = requireRole(await getCurrentUser(), "researcher");
  const studies = await fetchStudiesForMember(db, user.id);
  return (
    <section className="space-y-4">
      <h1>Your studies</h1>
      {studies.length === 0 ? (
        <p className="text-sm text-slate-700">You are not on any study's team yet.</p>
      ) : (
        <div className="card overflow-x-auto p-0">
          <table>
            <thead>
              <tr><th>Title</th><th>Status</th><th>Protocol</th><th>Owner</th><th>Your role</th><th>Updated</th></tr>
            </thead>
            <tbody>
              {studies.map((s) => (
                <tr key={s.id}>
                  <td><Link href={`/studies/${s.id}`}>{s.title}</Link></td>
                  <td><StatusBadge status={s.status} /></td>
                  <td>{s.protocolNumber ?? "—"}</td>
                  <td>{s.ownerName}</td>
                  <td>{s.myRole}</td>
                  <td>{s.updatedAt.toISOString().slice(0, 10)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
