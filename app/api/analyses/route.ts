import { createReadStream } from "node:fs";
import { mkdir, rename, rm } from "node:fs/promises";
import { join, resolve } from "node:path";
import { z } from "zod";
import { analyzeTrialStream, EXCLUSION_RULES } from "@/lib/analysis";
import { saveMultipartFile } from "@/lib/api/multipart";
import { errorResponse, route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { fetchImportsOf, insertImport } from "@/lib/data/imports";
import { env } from "@/lib/env";
import { getCurrentUser } from "@/lib/session";
import { FLAG_COLUMNS, TrialTableError } from "@/lib/trials";

/** Trial tables up to this size are accepted (413 beyond). */
export const ANALYSIS_UPLOAD_LIMIT = 100 * 1024 * 1024;

/** The form's fields; flags to drop come as drop_timed_out=1 etc. (one field each). */
const optionsSchema = z
  .object({
    start: z.enum(["actual", "nominal"]).default("actual"),
    exclude: z.enum(EXCLUSION_RULES).default("misfire"),
    unit: z.enum(["px", "mm", "deg"]).default("px"),
    geometry: z.enum(["plane", "sphere"]).default("plane"),
    drop_timed_out: z.literal("1").optional(),
    drop_recentered: z.literal("1").optional(),
    drop_clutched: z.literal("1").optional(),
  })
  .refine((o) => o.geometry === "plane" || o.unit === "deg", { path: ["geometry"], message: "view directions on the sphere need the unit deg" })
  .transform(({ drop_timed_out, drop_recentered, drop_clutched, ...o }) => ({
    ...o,
    dropFlagged: FLAG_COLUMNS.filter((_, i) => [drop_timed_out, drop_recentered, drop_clutched][i] === "1"),
  }));

export const GET = route(async () => {
  const user = requireRole(await getCurrentUser(), "researcher");
  return Response.json({ imports: await fetchImportsOf(db, user.id) });
});

/** Uploads a trial table (multipart field "file"), analyses it and keeps it as the researcher's import. */
export const POST = route(async (request: Request) => {
  const user = requireRole(await getCurrentUser(), "researcher");
  const dir = resolve(env.STORAGE_DIR, "imports");
  const upload = await saveMultipartFile(request, join(dir, "incoming"), ANALYSIS_UPLOAD_LIMIT);
  try {
    const options = optionsSchema.parse(upload.fields);
    const result = await analyzeTrialStream(createReadStream(upload.path), { ...options, file: upload.filename });
    await mkdir(dir, { recursive: true });
    const storageKey = `imports/${upload.sha256}-${Date.now()}.csv`;
    await rename(upload.path, resolve(env.STORAGE_DIR, storageKey));
    const id = await db.transaction(async (trx) => {
      const id = await insertImport(trx, { userId: user.id, filename: upload.filename, sizeBytes: upload.size, sha256: upload.sha256, storageKey, options, result });
      await appendAudit(trx, { actorUserId: user.id, actorLabel: user.email, action: "analysis.import", details: { importId: id, filename: upload.filename, sha256: upload.sha256, movements: result.movements } });
      return id;
    }).catch(async (e: unknown) => {
      await rm(resolve(env.STORAGE_DIR, storageKey), { force: true });
      throw e;
    });
    return Response.json({ id, ...result }, { status: 201 });
  } catch (e) {
    await rm(upload.path, { force: true });
    if (e instanceof TrialTableError) return errorResponse(422, "invalid_trial_table", e.message, e.toJSON());
    throw e;
  }
});
