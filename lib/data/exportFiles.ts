import { readdir, unlink } from "node:fs/promises";
import { isAbsolute, join, resolve } from "node:path";
import type { Queryable } from "@/lib/db";
import { env } from "@/lib/env";

/** The directory archives are written to (EXPORTS_DIR, absolute). */
export function exportsRoot(): string {
  return isAbsolute(env.EXPORTS_DIR) ? env.EXPORTS_DIR : resolve(process.cwd(), env.EXPORTS_DIR);
}

export const DAY_MS = 24 * 60 * 60 * 1000;

/** When a finished archive's file is deleted (retentionEnd): finished_at plus EXPORT_RETENTION_DAYS. */
export function retentionEnd(finishedAt: Date, days = env.EXPORT_RETENTION_DAYS): Date {
  return new Date(finishedAt.getTime() + days * DAY_MS);
}

/** The study's folder of archives, relative to exportsRoot(). */
export const studyExportDir = (studyId: number): string => `study-${studyId}`;

/**
 * Deletes the archive files of the given export jobs (deleteExportFiles) and records it: the path
 * goes, file_deleted_at is set. A file already gone counts as deleted. Run after the transaction
 * that superseded or expired the jobs has committed (a file system is not transactional): a job
 * whose file could not be deleted keeps its path, and the next sweep (sweepExportFiles) tries again.
 * @returns how many files were deleted (or were gone already).
 */
export async function deleteExportFiles(q: Queryable, exportIds: readonly number[], now = new Date()): Promise<number> {
  if (exportIds.length === 0) return 0;
  const rows = await q("exports").whereIn("id", exportIds).whereNotNull("path").select<{ id: number; path: string }[]>("id", "path");
  let deleted = 0;
  for (const r of rows) {
    try {
      await unlink(join(exportsRoot(), r.path));
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== "ENOENT") {
        console.error(`export ${r.id}: could not delete ${r.path}`, e);
        continue;
      }
    }
    await q("exports").where({ id: r.id }).update({ path: null, file_deleted_at: now });
    deleted++;
  }
  return deleted;
}

/**
 * Removes what an unfinished job left in its study's folder (removePartialFiles): the `.part`
 * file of a job that died before writeArchive could clean up (a killed process runs no cleanup).
 * Nothing partial is ever offered for download (only a done job's path is), this only frees disk.
 */
export async function removePartialFiles(studyId: number, exportId: number): Promise<void> {
  const dir = join(exportsRoot(), studyExportDir(studyId));
  const names = await readdir(dir).catch(() => [] as string[]);
  for (const name of names) {
    if (name.startsWith(`export-${exportId}-`) && name.endsWith(".part")) await unlink(join(dir, name)).catch(() => {});
  }
}
