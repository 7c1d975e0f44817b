import { createGunzip } from "node:zlib";
import { sampleColumns } from "@/lib/motion/csv";
import type { StreamFacts } from "@/lib/runner/streamPlausibility";

/** The most a decompressed stream may hold whatever it declares (bytes): ~10 minutes at 250 Hz. */
export const MAX_STREAM_BYTES = 16 * 1024 * 1024;
/**
 * The longest line a sample can take (bytes): every column of the stream format (16) holding the
 * longest text a JavaScript number prints as ("-1.2345678901234567e-123", 24 characters), the
 * commas between them and the newline. The runner writes numbers with String(n).
 */
export const MAX_SAMPLE_LINE_BYTES = sampleColumns.length * 24 + (sampleColumns.length - 1) + 1;
/** How much output zlib produces at a time, so a refusal comes at most this far past the cap. */
export const INFLATE_CHUNK_BYTES = 16 * 1024;

/**
 * The decompressed size a stream of `sampleCount` samples can have (streamByteCap): the header
 * and that many of the longest lines, never above MAX_STREAM_BYTES.
 * Cost: O(1). @throws never.
 * @example streamByteCap(600) // 240400 (a header and 600 lines of 400 bytes)
 */
export function streamByteCap(sampleCount: number): number {
  return Math.min(MAX_STREAM_BYTES, MAX_SAMPLE_LINE_BYTES + Math.max(0, sampleCount) * MAX_SAMPLE_LINE_BYTES);
}

/** Why a stream was refused before it was read to the end. */
export class StreamRefusal extends Error {
  /** Decompressed bytes produced when the refusal came (at most the cap plus one chunk). */
  readonly inflatedBytes: number;
  constructor(message: string, inflatedBytes: number) {
    super(message);
    this.name = "StreamRefusal";
    this.inflatedBytes = inflatedBytes;
  }
}

const HEADER_START = "t_ms,gyro_x,gyro_y,gyro_z";

/** Whether header names are columns of the stream format, each once, in the format's order. */
function isStreamHeader(names: readonly string[]): boolean {
  let next = 0;
  for (const n of names) {
    const k = (sampleColumns as readonly string[]).indexOf(n);
    if (k < next) return false;
    next = k + 1;
  }
  return true;
}
const NEWLINE = 0x0a;

/**
 * Decompresses an uploaded gzip stream as a stream and reads what plausibility needs
 * (inspectGzipStream): the number of samples and their first, last, earliest and latest t_ms.
 *
 * Purpose: a small upload must not make the server inflate megabytes (a decompression bomb).
 * Output is counted as zlib produces it, in chunks of INFLATE_CHUNK_BYTES, and decompression
 * stops at once when it passes the cap that the declared sample count allows (streamByteCap),
 * when there are more lines than declared, when a line is longer than a sample can be, or when
 * the header is not the stream format's. Runs on zlib's thread pool, not the event loop.
 * Source: RFC 1952 (gzip); the stream format of interfaces.md and docs/configuration.md.
 * Cost: O(min(output, cap)).
 * @throws StreamRefusal naming what is wrong (not gzip, corrupt, too large, bad header, too many samples).
 * @example await inspectGzipStream(gzipSync("t_ms,gyro_x,gyro_y,gyro_z\n0,1,2,3\n"), 1) // { samples: 1, firstMs: 0, lastMs: 0, minMs: 0, maxMs: 0 }
 */
export function inspectGzipStream(gz: Buffer, declaredSamples: number): Promise<StreamFacts> {
  if (gz.length < 18 || gz[0] !== 0x1f || gz[1] !== 0x8b) return Promise.reject(new StreamRefusal("not gzip data", 0));
  const cap = streamByteCap(declaredSamples);
  return new Promise((resolve, reject) => {
    const inflate = createGunzip({ chunkSize: INFLATE_CHUNK_BYTES });
    let bytes = 0, lines = 0, settled = false;
    let carry: Buffer | null = null;
    const facts: StreamFacts = { samples: 0, firstMs: NaN, lastMs: NaN, minMs: Infinity, maxMs: -Infinity };
    const fail = (message: string): void => {
      if (settled) return;
      settled = true;
      inflate.destroy();
      reject(new StreamRefusal(message, bytes));
    };
    const line = (buf: Buffer, start: number, end: number): void => {
      if (end > start && buf[end - 1] === 0x0d) end--;
      if (lines === 0) {
        const header = buf.toString("latin1", start, end);
        if (!header.startsWith(HEADER_START) || !isStreamHeader(header.split(","))) {
          fail(`the header must be the stream format's columns in order (${HEADER_START},…)`);
          return;
        }
        lines++;
        return;
      }
      if (end === start) return; // a blank line (the last newline)
      lines++;
      if (lines - 1 > declaredSamples) {
        fail(`more than the ${declaredSamples} samples sampleCount says`);
        return;
      }
      let comma = buf.indexOf(0x2c, start);
      if (comma === -1 || comma > end) comma = end;
      const t = Number(buf.toString("latin1", start, comma));
      if (!Number.isFinite(t)) {
        fail(`sample ${lines - 1}: t_ms is not a number`);
        return;
      }
      if (facts.samples === 0) facts.firstMs = t;
      facts.lastMs = t;
      if (t < facts.minMs) facts.minMs = t;
      if (t > facts.maxMs) facts.maxMs = t;
      facts.samples++;
    };
    inflate.on("data", (chunk: Buffer) => {
      if (settled) return;
      bytes += chunk.length;
      if (bytes > cap) {
        fail(`more than ${cap} bytes decompressed, the most ${declaredSamples} samples can take`);
        return;
      }
      const buf: Buffer = carry ? Buffer.concat([carry, chunk]) : chunk;
      let start = 0;
      for (let nl = buf.indexOf(NEWLINE); nl !== -1 && !settled; nl = buf.indexOf(NEWLINE, start)) {
        line(buf, start, nl);
        start = nl + 1;
      }
      carry = start < buf.length ? buf.subarray(start) : null;
      if (carry && carry.length > MAX_SAMPLE_LINE_BYTES) fail(`a line longer than ${MAX_SAMPLE_LINE_BYTES} bytes`);
    });
    inflate.on("error", (e: Error) => fail(`cannot be decompressed (${e.message})`));
    inflate.on("end", () => {
      if (settled) return;
      if (carry) line(carry, 0, carry.length);
      if (settled) return;
      if (lines === 0) return fail("empty");
      settled = true;
      resolve(facts.samples === 0 ? { samples: 0, firstMs: 0, lastMs: 0, minMs: 0, maxMs: 0 } : facts);
    });
    inflate.end(gz);
  });
}
