import { db } from "@/lib/db";
import { fetchStudiesForMember } from "@/lib/data/studies";
import { getCurrentUser } from "@/lib/session";
import { requireRole } from "@/lib/auth/guards";
import { NewStudyForm } from "@/components/study/NewStudyForm";
import { StudiesTable } from "@/components/study/StudiesTable";

export const metadata = { title: "Studies" };

const LABEL: Record<string, string> = { draft: "Draft", in_review: "In review", approved: "Approved", recruiting: "Recruiting", closed: "Closed" };

export default async function StudiesPage() {
  const user = requireRole(await getCurrentUser(), "researcher");
  const studies = await fetchStudiesForMember(db, user.id);
  return (
    <section className="space-y-4">
      <h1>Your studies</h1>
      {studies.length === 0 ? (
        <p className="text-sm text-slate-700">You are not on any study's team yet.</p>
      ) : (
        <StudiesTable rows={studies.map((s) => ({ id: s.id, title: s.title, status: s.status, statusLabel: LABEL[s.status] ?? s.status, protocolNumber: s.protocolNumber, ownerName: s.ownerName, myRole: s.myRole, updated: s.updatedAt.toISOString().slice(0, 10) }))} />
      )}
      <NewStudyForm />
    </section>
  );
}
