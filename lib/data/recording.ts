import { gunzipSync } from "node:zlib";
import type { Knex } from "knex";
import { conflict, unprocessable } from "@/lib/errors";
import { batchProblems, type SequenceBatch } from "@/lib/runner";
import { planOf, withdrawnError, type SessionContext } from "./participants";

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
    csv = gunzipSync(gz, { maxOutputLength: MAX_STREAM_BYTES });
  } catch (e) {
    throw unprocessable(`stream: cannot be decompressed (${e instanceof Error ? e.message : String(e)})`);
  }
  let lines = 0;
  for (let i = 0; i < csv.length; i++) if (csv[i] === 0x0a) lines++;
  if (csv.length > 0 && csv[csv.length - 1] !== 0x0a) lines++;
  if (!csv.subarray(0, 64).toString("utf8").startsWith("t_ms,gyro_x,gyro_y,gyro_z")) throw unprocessable("stream: the header must start with t_ms,gyro_x,gyro_y,gyro_z");
  if (lines - 1 !== batch.stream.sampleCount) throw unprocessable(`stream: ${lines - 1} samples, but sampleCount says ${batch.stream.sampleCount}`);
  return gz;
}

const isDuplicateKey = (e: unknown): boolean => typeof e === "object" && e !== null && (e as { code?: string }).code === "ER_DUP_ENTRY";

/**
 * Stores one sequence upload (ingestSequenceBatch): its movements as trial rows and its stream,
 * compressed, in one transaction. Idempotent: a repeat of the same key stores nothing and
 * answers duplicate. Refuses a withdrawn session (410), a session without consent (409) and an
 * implausible batch (422, with the problems).
 */
export async function ingestSequenceBatch(db: Knex, ctx: SessionContext, batch: SequenceBatch): Promise<IngestResult> {
  const p = ctx.participant;
  if (p.status === "withdrawn") throw withdrawnError();
  if (p.status === "invited") throw conflict("Consent comes first.");
  const plan = planOf(ctx);
  if (!plan) throw conflict("Consent comes first.");
  const problems = batchProblems(batch, p.id, plan, ctx.design);
  if (problems.length > 0) throw unprocessable(`implausible sequence: ${problems[0]}`, problems.map((message) => ({ path: "batch", message })));
  const gz = decodeStream(batch);
  try {
    return await db.transaction(async (trx) => {
      // The activity update locks the participant row (a withdrawal takes the same lock) and
      // refuses a withdrawn row in the same round trip; SET runs left to right, so started_at
      // still sees the old status. A repeated key then fails the unique upload_key index on the
      // stream insert, which rolls all of this back and answers duplicate (below).
      const now = new Date();
      const matched = await trx("participants").where({ id: p.id }).whereNot({ status: "withdrawn" }).update({
        last_activity_at: now,
        started_at: trx.raw("IF(status = 'consented', ?, started_at)", [now]),
        status: trx.raw("IF(status = 'consented', 'in_progress', status)"),
      });
      if (matched === 0) throw withdrawnError();
      const common = { participant_id: p.id, condition: batch.condition, condition_index: batch.conditionIndex, block: batch.block, sequence: batch.sequence, practice: batch.practice };
      await trx("sequence_streams").insert({ ...common, upload_key: batch.key, sample_count: batch.stream.sampleCount, movement_count: batch.movements.length, stream_gz: gz, quality: JSON.stringify(batch.quality) });
      await trx("trials").insert(batch.movements.map((m) => ({ ...common, ...m, unit: batch.unit, amplitude: batch.amplitude, width: batch.width, hit: m.hit === 1, upload_key: batch.key })));
      return { duplicate: false, movements: batch.movements.length };
    });
  } catch (e) {
    if (isDuplicateKey(e)) return { duplicate: true, movements: 0 };
    throw e;
  }
}
