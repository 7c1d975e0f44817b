// Worker: analyses one byte range of a trial-table file and posts what it read back.
import { createReadStream } from "node:fs";
import { parentPort, workerData } from "node:worker_threads";
import { forEachTrialRow } from "../../trials/forEachTrialRow";
import { TrialTableError } from "../../trials/trialTableError";
import { analysisOptionsSchema } from "../options";
import { TrialAccumulator } from "../trialAccumulator";
import { toChunkData } from "./chunkData";
import type { ChunkJob, ChunkReply } from "./chunkTypes";

async function run(job: ChunkJob): Promise<ChunkReply> {
  const opts = analysisOptionsSchema.parse(job.options);
  const acc = new TrialAccumulator(opts);
  const input = createReadStream(job.path, { start: job.start, end: job.end - 1, highWaterMark: 1 << 20 });
  let sawQuote = false;
  input.on("data", (chunk) => {
    if (!sawQuote && (chunk as Buffer).indexOf(34) !== -1) sawQuote = true;
  });
  try {
    const read = job.header
      ? forEachTrialRow(input, { file: opts.file, legacy: false, header: job.header }, (row) => acc.add(row))
      : forEachTrialRow(input, { file: opts.file, legacy: false }, (row) => acc.add(row));
    const summary = await read;
    return { ok: true, data: toChunkData(acc), lines: summary.lines, sawQuote };
  } catch (err) {
    if (err instanceof TrialTableError) return { ok: false, line: err.line, column: err.column, detail: err.detail, sawQuote };
    throw err;
  }
}

run(workerData as ChunkJob).then(
  (reply) => {
    const c = reply.ok ? reply.data.columns : null;
    parentPort!.postMessage(reply, c ? Object.values(c).map((a) => a.buffer as ArrayBuffer) : []);
  },
  (err: unknown) => {
    throw err;
  },
);
