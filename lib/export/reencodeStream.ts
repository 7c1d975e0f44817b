import { gunzipSync, gzipSync } from "node:zlib";
import { parseSampleCsv, sampleFromTable } from "../motion/csv";
import { formatSampleCsv } from "../motion/csvFormat";
import type { MotionSample } from "../motion/sample";

/** The largest decompressed stream an archive takes (bytes; the upload's own cap, lib/ingest/inspectStream.ts). */
const MAX_STREAM_BYTES = 16 * 1024 * 1024;

/**
 * A stored raw stream re-encoded for an archive (reencodeStream).
 *
 * Purpose: an archive carries only what the stream format defines, written the same way for
 * everyone: the stored gzip is decompressed (capped), parsed and validated as the replay format
 * (parseSampleCsv: numbers only, columns it does not know dropped), written again by the one
 * stream writer (formatSampleCsv) and compressed by Node's zlib, whose gzip header has no file
 * name, no comment and a modification time of 0 (RFC 1952 §2.3.1: MTIME = 0 means no time
 * stamp). So nothing the participant's browser put into the header (a compressor's time stamp,
 * a file name) and nothing outside the contract's columns leaves in an archive.
 * Source: RFC 1952; interfaces.md "Raw sensor stream". Cost: O(stream bytes).
 * @throws SampleCsvError (not the stream format) or a zlib Error (corrupt, or larger than the cap).
 * @example gunzipSync(reencodeStream(gzipSync("t_ms,gyro_x,gyro_y,gyro_z,note\n0,1,2,3,hi\n"), "s")).toString() // "t_ms,gyro_x,…,screen_angle\n0,1,2,3,,,,,,,0\n"
 */
export function reencodeStream(gz: Buffer, name: string): Buffer {
  const text = gunzipSync(gz, { maxOutputLength: MAX_STREAM_BYTES }).toString("utf8");
  const table = parseSampleCsv(text, name);
  const samples: MotionSample[] = [];
  for (let i = 0; i < table.length; i++) samples.push(sampleFromTable(table, i, { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }));
  return gzipSync(formatSampleCsv(samples), { level: 6 });
}
