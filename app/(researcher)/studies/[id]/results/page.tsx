import Link from "next/link";
import { notFound } from "next/navigation";
import { ResultsDashboard } from "@/components/results/ResultsDashboard";
import { db } from "@/lib/db";
import { assertStudyTeam } from "@/lib/data/results";
import { AppError } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Results" };

export default async function ResultsPage({ params }: { params: Promise<{ id: string }> }) {
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id <= 0) notFound();
  let study, teamRole;
  try {
    ({ study, teamRole } = await assertStudyTeam(db, await getCurrentUser(), id));
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
  return (
    <article className="space-y-4">
      <p className="text-sm print:hidden"><Link href={`/studies/${id}`}>← {study.title}</Link></p>
      <h1>Results: {study.title}</h1>
      <ResultsDashboard studyId={id} canExport={teamRole !== "viewer"} />
    </article>
  );
}
