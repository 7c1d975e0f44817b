import { db } from "@/lib/db";
import { listDocuments } from "@/lib/storage/documents";
import { DocumentUpload } from "@/components/study/DocumentUpload";
import { studyForPage } from "../access";

export const metadata = { title: "Documents" };

export default async function DocumentsPage({ params }: { params: Promise<{ id: string }> }) {
  const { study, canEdit } = await studyForPage((await params).id);
  const documents = await listDocuments(db, study.id);
  return (
    <div className="space-y-4">
      {canEdit && <DocumentUpload studyId={study.id} />}
      <section className="space-y-2">
        <h2>Documents</h2>
        {documents.length === 0 ? <p className="text-sm">No documents yet.</p> : (
          <table><thead><tr><th>File</th><th>Kind</th><th>Size</th><th>SHA-256</th><th>Uploaded by</th><th>When (UTC)</th></tr></thead>
            <tbody>{documents.map((d) => <tr key={d.id}><td><a href={`/api/documents/${d.id}`}>{d.filename}</a></td><td>{d.kind.replace("_", " ")}</td><td>{(d.sizeBytes / 1024).toFixed(1)} kB</td><td><code className="text-xs break-all">{d.sha256}</code></td><td>{d.uploadedBy}</td><td>{d.uploadedAt.toISOString().slice(0, 16).replace("T", " ")}</td></tr>)}</tbody>
          </table>
        )}
      </section>
    </div>
  );
}
