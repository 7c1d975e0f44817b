import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { requireUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";
import { readDocument } from "@/lib/storage/documents";
import { storeFromEnv } from "@/lib/storage/storeFromEnv";

type Ctx = { params: Promise<{ id: string }> };

/** Downloads a document: the study's team, or reviewers once the study is beyond draft. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = requireUser(await getCurrentUser());
  const { document, bytes } = await readDocument(db, storeFromEnv(), user, id);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": document.mimeType,
      "content-length": String(bytes.length),
      "content-disposition": `attachment; filename="${document.filename.replace(/[^\w. -]/g, "_")}"; filename*=UTF-8''${encodeURIComponent(document.filename)}`,
      "x-content-sha256": document.sha256,
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
    },
  });
});
