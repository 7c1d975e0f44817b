import { createReadStream } from "node:fs";
import { open, stat } from "node:fs/promises";
import { Worker } from "node:worker_threads";
import { parse } from "csv-parse/sync";
import { TrialTableError } from "../../trials/trialTableError";
import { analyzeTrialStream, factorOrderOf, type StreamAnalysisOptions } from "../analyzeTrialStream";
import { buildResult } from "../buildResult";
import { analysisOptionsSchema } from "../options";
import type { PathAccuracy } from "../pathAccuracy";
import type { AnalysisResult } from "../result";
import { TrialAccumulator } from "../trialAccumulator";
import { fromChunkData } from "./chunkData";
import type { ChunkJob, ChunkReply } from "./chunkTypes";

export interface FileAnalysisOptions extends StreamAnalysisOptions {
  /**
   * Worker threads for large files (default 1 = no workers: with the plain-CSV fast path one thread
   * reads 1 M movements in about 2 s, and starting TypeScript workers costs more than it saves on
   * the project's 2 shared cores; measured with bench:analysis).
   */
  threads?: number;
  /** Files smaller than this many bytes are read on the calling thread (default 16 MB). */
  parallelFrom?: number;
}

async function nextLineStart(path: string, from: number): Promise<number> {
  const fh = await open(path, "r");
  try {
    const buf = Buffer.alloc(64 * 1024);
    let pos = from;
    for (;;) {
      const { bytesRead } = await fh.read(buf, 0, buf.length, pos);
      if (bytesRead === 0) return pos;
      const i = buf.subarray(0, bytesRead).indexOf(10);
      if (i !== -1) return pos + i + 1;
      pos += bytesRead;
    }
  } finally {
    await fh.close();
  }
}

function runChunk(job: ChunkJob): Promise<ChunkReply> {
  return new Promise((resolve, reject) => {
    const url = new URL("./chunkWorker.ts", import.meta.url).href;
    // Workers do not inherit tsx's in-process loader: the worker registers it, then loads the chunk
    // reader.
    const tsxApi = import.meta.resolve("tsx/esm/api");
    const boot = `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(url)}); })`;
    const worker = new Worker(boot, { eval: true, workerData: job });
    worker.once("message", (m: ChunkReply) => resolve(m));
    worker.once("error", reject);
    worker.once("exit", (code) => {
      if (code !== 0) reject(new Error(`analysis worker stopped with code ${code}`));
    });
  });
}

/**
 * Analyses a trial-table file, on the calling thread by default. With `threads` > 1, large files are
 * split at line boundaries and read in worker threads; their sequences and movements are merged in
 * file order (TrialAccumulator.merge, with the same checks across the boundaries). Files
 * with a quote character anywhere fall back to one thread, since a quoted line break could straddle
 * a split. Needs the TypeScript loader in workers (tsx passes it on); elsewhere use threads: 1.
 *
 * Cost: O(bytes / threads) time; memory O(sequences + 50 bytes × movements).
 * @throws ZodError on bad options; TrialTableError (rejects) on bad input, with absolute lines.
 */
export async function analyzeTrialFile(
  path: string,
  options: FileAnalysisOptions = {},
  pathMeasures?: ReadonlyMap<string, PathAccuracy>,
): Promise<AnalysisResult> {
  const { threads: wanted, parallelFrom = 16 * 1024 * 1024, ...streamOptions } = options;
  const threads = Math.max(1, Math.min(wanted ?? 1, 8));
  const file = streamOptions.file ?? path;
  // 1 MB reads instead of the default 64 kB: 16× fewer round trips to the file-system thread pool.
  const single = () => analyzeTrialStream(createReadStream(path, { highWaterMark: 1 << 20 }), { ...streamOptions, file }, pathMeasures);
  let size: number;
  try {
    size = (await stat(path)).size;
  } catch (err) {
    throw new TrialTableError({ file, line: 1, column: "(file)" }, `cannot read: ${(err as Error).message}`);
  }
  if (threads === 1 || size < parallelFrom || streamOptions.legacy === true) return single();

  const headerEnd = await nextLineStart(path, 0);
  const fh = await open(path, "r");
  const headBuf = Buffer.alloc(headerEnd);
  await fh.read(headBuf, 0, headerEnd, 0);
  await fh.close();
  const header = (parse(headBuf, { bom: true }) as string[][])[0];
  if (!header || headBuf.indexOf(34) !== -1) return single();

  const bounds = [0];
  for (let i = 1; i < threads; i++) bounds.push(await nextLineStart(path, Math.floor((size * i) / threads)));
  bounds.push(size);
  const jobs: ChunkJob[] = [];
  for (let i = 0; i < threads; i++) {
    const start = bounds[i]!;
    const end = bounds[i + 1]!;
    if (end <= start) continue;
    jobs.push({ path, start, end, header: i === 0 ? undefined : header, options: { ...streamOptions, file } });
  }
  let replies: ChunkReply[];
  try {
    replies = await Promise.all(jobs.map(runChunk));
  } catch {
    // Workers unavailable here (e.g. no TypeScript loader): read on this thread instead.
    return single();
  }
  if (replies.some((r) => r.sawQuote)) return single();

  const { legacy: _legacy, parser: _parser, ...rest } = streamOptions;
  const opts = analysisOptionsSchema.parse({ ...rest, file });
  const merged = new TrialAccumulator(opts);
  let offset = 0;
  for (const reply of replies) {
    if (!reply.ok) throw new TrialTableError({ file, line: reply.line + offset, column: reply.column }, reply.detail);
    merged.merge(fromChunkData(reply.data, opts, offset));
    // Every chunk but the last ends with a line break, so csv-parse counts one line more than it holds.
    offset += reply.lines - 1;
  }
  return buildResult(merged, opts, factorOrderOf(header), pathMeasures);
}
