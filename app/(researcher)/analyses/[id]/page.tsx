import Link from "next/link";
import { notFound } from "next/navigation";
import { ResultTables } from "@/components/analysis/ResultTables";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchImportOf } from "@/lib/data/imports";
import { getCurrentUser } from "@/lib/session";

export default async function ImportPage({ params }: { params: Promise<{ id: string }> }) {
  const user = requireRole(await getCurrentUser(), "researcher");
  const id = Number((await params).id);
  const found = Number.isInteger(id) && id > 0 ? await fetchImportOf(db, user.id, id) : undefined;
  if (!found) notFound();
  return (
    <section className="space-y-4">
      <p className="text-sm"><Link href="/analyses">← All imports</Link></p>
      <h1>{found.filename}</h1>
      <p className="text-xs text-slate-600">SHA-256 <code>{found.sha256}</code></p>
      <ResultTables result={found.result} />
    </section>
  );
}
