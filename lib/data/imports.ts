import type { Queryable } from "@/lib/db";
import type { AnalysisResult } from "@/lib/analysis";

export type AnalysisImport = {
  id: number;
  filename: string;
  sizeBytes: number;
  sha256: string;
  options: { start: string; exclude: string; unit: string };
  createdAt: Date;
};

type ImportRow = {
  id: number;
  user_id: number;
  filename: string;
  size_bytes: number | string;
  sha256: string;
  storage_key: string;
  options: unknown;
  result: unknown;
  created_at: Date;
};

const parse = <T>(v: unknown): T => (typeof v === "string" ? (JSON.parse(v) as T) : (v as T));

function toImport(r: Omit<ImportRow, "result">): AnalysisImport {
  return { id: r.id, filename: r.filename, sizeBytes: Number(r.size_bytes), sha256: r.sha256, options: parse(r.options), createdAt: r.created_at };
}

export async function insertImport(
  q: Queryable,
  i: { userId: number; filename: string; sizeBytes: number; sha256: string; storageKey: string; options: object; result: AnalysisResult },
): Promise<number> {
  const [id] = await q("analysis_imports").insert({
    user_id: i.userId,
    filename: i.filename.slice(0, 255),
    size_bytes: i.sizeBytes,
    sha256: i.sha256,
    storage_key: i.storageKey,
    options: JSON.stringify(i.options),
    result: JSON.stringify(i.result),
  });
  return Number(id);
}

/** A researcher's imports, newest first (without the results). */
export async function fetchImportsOf(q: Queryable, userId: number): Promise<AnalysisImport[]> {
  const rows = await q<ImportRow>("analysis_imports").where({ user_id: userId }).orderBy("id", "desc").select("id", "user_id", "filename", "size_bytes", "sha256", "storage_key", "options", "created_at");
  return rows.map(toImport);
}

/** One import with its result, only when it belongs to the user. */
export async function fetchImportOf(q: Queryable, userId: number, id: number): Promise<(AnalysisImport & { result: AnalysisResult }) | undefined> {
  const row = await q<ImportRow>("analysis_imports").where({ id, user_id: userId }).first();
  return row ? { ...toImport(row), result: parse<AnalysisResult>(row.result) } : undefined;
}
