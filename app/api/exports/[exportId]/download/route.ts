import { createReadStream } from "node:fs";
import { stat } from "node:fs/promises";
import { Readable } from "node:stream";
import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { fetchExportFile, fetchExportJob } from "@/lib/data/exports";
import { assertStudyTeam } from "@/lib/data/results";
import { AppError, conflict, notFound, unauthorized } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ exportId: string }> };
const paramsSchema = z.object({ exportId: z.coerce.number().int().positive() });

/** GET: the finished archive, streamed from disk (never read into memory). Team only; audit-logged. */
export const GET = route(async (_request: Request, context: Ctx) => {
  const { exportId } = parseParams(paramsSchema, await context.params);
  const user = await getCurrentUser();
  if (!user) throw unauthorized();
  const file = await fetchExportFile(db, exportId);
  if (!file) throw notFound("No such export.");
  await assertStudyTeam(db, user, file.studyId);
  if (file.superseded) throw new AppError(410, "superseded", "This archive is superseded: a participant in it was erased, so its file was deleted. Start a new export.");
  if (file.fileDeleted) throw new AppError(410, "deleted", "This archive's file was deleted at the end of its retention period. Start a new export.");
  if (!file.path) throw conflict(file.status === "failed" ? "This export failed; start a new one." : "This export is not finished yet.");
  const job = await fetchExportJob(db, exportId);
  const size = (await stat(file.path)).size;
  await appendAudit(db, { actorUserId: user.id, actorLabel: user.email, action: "export.download", studyId: file.studyId, details: { exportId, sha256: job?.sha256 ?? null, sizeBytes: size } });
  const body = Readable.toWeb(createReadStream(file.path)) as ReadableStream<Uint8Array>;
  return new Response(body, {
    headers: {
      "content-type": "application/zip",
      "content-length": String(size),
      "content-disposition": `attachment; filename="${job?.fileName ?? `export-${exportId}.zip`}"`,
      "cache-control": "no-store",
      ...(job?.sha256 ? { "x-content-sha256": job.sha256 } : {}),
    },
  });
});
