import { parseParams, readFormLimited } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanEditStudy, assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { badRequest, tooLarge, unsupportedType } from "@/lib/errors";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { DOCUMENT_LIMIT_BYTES } from "@/lib/storage/detectDocumentType";
import { listDocuments, saveDocument } from "@/lib/storage/documents";
import { storeFromEnv } from "@/lib/storage/storeFromEnv";

type Ctx = { params: Promise<{ id: string }> };

export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  await assertCanViewStudy(db, await getCurrentUser(), id);
  return Response.json({ documents: await listDocuments(db, id) });
});

/** multipart/form-data: file (PDF, PNG or JPEG, ≤ 10 MB) and kind (approval_letter | protocol | other). */
export const POST = route(async (request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = await getCurrentUser();
  await assertCanEditStudy(db, user, id);
  if (!(request.headers.get("content-type") ?? "").toLowerCase().startsWith("multipart/form-data")) throw unsupportedType("Send the file as multipart/form-data.");
  // Refuse on the declared size before reading anything (the form's own overhead is allowed for).
  if (Number(request.headers.get("content-length") ?? "0") > DOCUMENT_LIMIT_BYTES + 64 * 1024) throw tooLarge("The file is over the 10 MB limit.");
  // counted as it arrives: a body without Content-Length (chunked) cannot grow past the limit either
  const form = await readFormLimited(request, DOCUMENT_LIMIT_BYTES + 64 * 1024);
  const file = form.get("file");
  if (!(file instanceof File)) throw badRequest("Attach the file in the field \"file\".");
  if (file.size > DOCUMENT_LIMIT_BYTES) throw tooLarge("The file is over the 10 MB limit.");
  const doc = await saveDocument(db, storeFromEnv(), user, id, { name: file.name, bytes: Buffer.from(await file.arrayBuffer()), kind: String(form.get("kind") ?? "other") });
  return Response.json({ document: doc }, { status: 201 });
});
