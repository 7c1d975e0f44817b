import { gunzipSync } from "node:zlib";
import type { Knex } from "knex";
import { conflict, unprocessable } from "@/lib/errors";
import { batchProblems, type SequenceBatch } from "@/lib/runner";
import { refusalFor } from "./participantLock";
import { assertConsented, planOf, type SessionContext } from "./participants";

/** The largest decompressed stream accepted (bytes): ~10 minutes at 250 Hz. */
export const MAX_STREAM_BYTES = 16 * 1024 * 1024;

export type IngestResult = { duplicate: boolean; movements: number };

/**
 * Decodes and checks an upload's stream: base64 → gzip (magic 1f 8b) → CSV whose data lines
 * number `sampleCount`. Returns the gzip bytes to store as they came.
 * @throws AppError 422 naming what is wrong.
 */
export function decodeStream(batch: SequenceBatch): Buffer {
  const gz = Buffer.from(batch.stream.gzipBase64, "base64");
  if (gz.length < 18 || gz[0] !== 0x1f || gz[1] !== 0x8b) throw unprocessable("stream: not gzip data");
  let csv: Buffer;
  try {
    csv = gunzipSync(gz, { maxOutputLength: MAX_STREAM_BYTES, chunkSize: 64 * 1024 });
  } catch (e) {
    throw unprocessable(`stream: cannot be decompressed (${e instanceof Error ? e.message : String(e)})`);
  }
  let lines = 0;
  for (let i = csv.indexOf(0x0a); i !== -1; i = csv.indexOf(0x0a, i + 1)) lines++;
  if (csv.length > 0 && csv[csv.length - 1] !== 0x0a) lines++;
  if (!csv.subarray(0, 64).toString("utf8").startsWith("t_ms,gyro_x,gyro_y,gyro_z")) throw unprocessable("stream: the header must start with t_ms,gyro_x,gyro_y,gyro_z");
  if (lines - 1 !== batch.stream.sampleCount) throw unprocessable(`stream: ${lines - 1} samples, but sampleCount says ${batch.stream.sampleCount}`);
  return gz;
}

type Outcome = { outcome: "stored" | "duplicate" | "refused"; movements: number | string };

/**
 * Stores one sequence upload (ingestSequenceBatch): its movements as trial rows and its stream,
 * compressed, in one transaction and one round trip to the database (the record_sequence
 * procedure, db/migrations/20261202000100_create_record_sequence.ts). Idempotent: a repeat of the
 * same key stores nothing and answers duplicate. Refuses a withdrawn session (410, also when the
 * withdrawal came after `ctx` was read: the procedure checks the row under its lock), a session
 * without consent or already complete (409) and an implausible batch (422, with the problems).
 */
export async function ingestSequenceBatch(db: Knex, ctx: SessionContext, batch: SequenceBatch): Promise<IngestResult> {
  const p = ctx.participant;
  assertConsented(ctx);
  const plan = planOf(ctx);
  if (!plan) throw conflict("Consent comes first.");
  const problems = batchProblems(batch, p.id, plan, ctx.design);
  if (problems.length > 0) throw unprocessable(`implausible sequence: ${problems[0]}`, problems.map((message) => ({ path: "batch", message })));
  const gz = decodeStream(batch);
  const [sets] = (await db.raw("CALL record_sequence(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", [
    p.id, new Date(), batch.key, batch.condition, batch.conditionIndex, batch.block, batch.sequence, batch.practice ? 1 : 0,
    batch.unit, batch.amplitude, batch.width, batch.stream.sampleCount, gz, JSON.stringify(batch.quality),
    JSON.stringify(batch.movements), // movementSchema is strict: exactly the fields record_sequence reads with JSON_TABLE
  ])) as [[Outcome[], unknown]];
  const answer = sets[0]?.[0];
  if (!answer) throw new Error("record_sequence answered no outcome");
  if (answer.outcome === "duplicate") return { duplicate: true, movements: 0 };
  if (answer.outcome === "refused") {
    const row = (await db("participants").where({ id: p.id }).first("status")) as { status: string } | undefined;
    throw refusalFor(row?.status);
  }
  return { duplicate: false, movements: Number(answer.movements) };
}
