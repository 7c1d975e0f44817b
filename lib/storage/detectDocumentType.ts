import { fileTypeFromBuffer } from "file-type";

/** The document types the protocol store accepts. */
export const DOCUMENT_TYPES = { "application/pdf": "pdf", "image/png": "png", "image/jpeg": "jpg" } as const;
export type DocumentMime = keyof typeof DOCUMENT_TYPES;
/** Largest accepted document: 10 MB. */
export const DOCUMENT_LIMIT_BYTES = 10 * 1024 * 1024;

/**
 * The type of an uploaded document from its magic bytes (detectDocumentType), never from the name
 * or the browser's claim; null when it is not PDF, PNG or JPEG.
 *
 * Source: the `file-type` package's signatures (PDF "%PDF", PNG 89 50 4E 47, JPEG FF D8 FF).
 * Cost: reads the first few kB.
 * @throws never.
 * @example await detectDocumentType(Buffer.from("%PDF-1.4\n…")) // "application/pdf"
 */
export async function detectDocumentType(bytes: Uint8Array): Promise<DocumentMime | null> {
  const found = await fileTypeFromBuffer(bytes);
  return found && found.mime in DOCUMENT_TYPES ? (found.mime as DocumentMime) : null;
}
