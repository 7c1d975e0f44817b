import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { assertCanEditStudy, assertCanViewStudy, requireUser, type SessionUser } from "@/lib/auth/guards";
import type { Queryable } from "@/lib/db";
import { notFound, tooLarge, unsupportedType, unprocessable } from "@/lib/errors";
import { auditAs } from "@/lib/study/service/audit";
import type { StudyDocumentRow } from "@/lib/study/service/rows";
import type { BlobStore } from "./blobStore";
import { DOCUMENT_LIMIT_BYTES, DOCUMENT_TYPES, detectDocumentType } from "./detectDocumentType";

export const DOCUMENT_KINDS = ["approval_letter", "protocol", "other"] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];
export type StudyDocument = { id: number; studyId: number; kind: DocumentKind; filename: string; mimeType: string; sizeBytes: number; sha256: string; uploadedBy: string; uploadedAt: Date };

const safeName = (name: string) => (name.replace(/[\\/\u0000-\u001f"]/g, "_").trim() || "document").slice(0, 200);

/**
 * Stores one protocol document (editor or owner): at most 10 MB, PDF/PNG/JPEG by magic bytes,
 * SHA-256 of the bytes, uploader and time recorded; the audit log gets the hash.
 * @throws 413 over the limit, 415 for another type (nothing is stored in either case), 422 for a bad kind.
 */
export async function saveDocument(db: Knex, store: BlobStore, user: SessionUser | null, studyId: number, file: { name: string; bytes: Buffer; kind: string }): Promise<StudyDocument> {
  await assertCanEditStudy(db, user, studyId);
  if (!(DOCUMENT_KINDS as readonly string[]).includes(file.kind)) throw unprocessable("Choose what the document is.", [{ path: "kind", message: "approval_letter, protocol or other" }]);
  if (file.bytes.length > DOCUMENT_LIMIT_BYTES) throw tooLarge("The file is over the 10 MB limit.");
  if (file.bytes.length === 0) throw unprocessable("The file is empty.", [{ path: "file", message: "empty" }]);
  const mime = await detectDocumentType(file.bytes);
  if (!mime) throw unsupportedType("Only PDF, PNG and JPEG documents are accepted (checked by the file's content).");
  const sha256 = createHash("sha256").update(file.bytes).digest("hex");
  const key = `documents/${studyId}/${randomUUID()}.${DOCUMENT_TYPES[mime]}`;
  await store.put(key, file.bytes, mime);
  let id: number;
  try {
    id = await db.transaction(async (trx) => {
      const [newId] = await trx("study_documents").insert({ study_id: studyId, kind: file.kind, filename: safeName(file.name), mime_type: mime, size_bytes: file.bytes.length, sha256, storage_key: key, uploaded_by: user!.id });
      await auditAs(trx, user!, "document.upload", studyId, { documentId: Number(newId), kind: file.kind, filename: safeName(file.name), sha256, sizeBytes: file.bytes.length });
      return Number(newId);
    });
  } catch (e) {
    await store.delete(key);
    throw e;
  }
  return (await listDocuments(db, studyId)).find((d) => d.id === id)!;
}

/** A study's documents, newest first. */
export async function listDocuments(q: Queryable, studyId: number): Promise<StudyDocument[]> {
  const rows = await q("study_documents as d").join("users as u", "u.id", "d.uploaded_by").where("d.study_id", studyId).orderBy("d.id", "desc").select<(StudyDocumentRow & { uploader: string })[]>("d.*", "u.email as uploader");
  return rows.map((r) => ({ id: r.id, studyId: r.study_id, kind: r.kind, filename: r.filename, mimeType: r.mime_type, sizeBytes: r.size_bytes, sha256: r.sha256, uploadedBy: r.uploader, uploadedAt: r.uploaded_at }));
}

/** Reads one document for download: the study's team, or reviewers once the study is beyond draft. */
export async function readDocument(db: Knex, store: BlobStore, user: SessionUser | null, documentId: number): Promise<{ document: StudyDocument; bytes: Buffer }> {
  requireUser(user);
  const row = await db<StudyDocumentRow>("study_documents").where({ id: documentId }).first();
  if (!row) throw notFound("No such document.");
  await assertCanViewStudy(db, user, row.study_id);
  const document = (await listDocuments(db, row.study_id)).find((d) => d.id === documentId)!;
  return { document, bytes: await store.get(row.storage_key) };
}
