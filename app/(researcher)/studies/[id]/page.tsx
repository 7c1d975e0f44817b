import { notFound } from "next/navigation";
import { assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";
import { StatusBadge } from "@/components/ui/StatusBadge";

export default async function StudyPage({ params }: { params: Promise<{ id: string }> }) {
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id <= 0) notFound();
  let access;
  try {
    access = await assertCanViewStudy(db, await getCurrentUser(), id);
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
  const { study, teamRole } = access;
  return (
    <article className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1>{study.title}</h1>
        <StatusBadge status={study.status} />
      </div>
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold">Ethics protocol</dt><dd>{study.protocolNumber ?? "not yet assigned"}</dd>
        <dt className="font-semibold">Your role</dt><dd>{teamRole}</dd>
      </dl>
      <p className="max-w-prose whitespace-pre-line text-sm">{study.summary}</p>
    </article>
  );
}
