import type { Knex } from "knex";
import { conflict, unprocessable } from "@/lib/errors";
import { inspectGzipStream, StreamRefusal } from "@/lib/ingest/inspectStream";
import { batchProblems, type SequenceBatch } from "@/lib/runner";
import type { Problem } from "@/lib/runner/plausibility";
import { streamProblems } from "@/lib/runner/streamPlausibility";
import { refusalFor } from "./participantLock";
import { assertConsented, planOf, type SessionContext } from "./participants";

export type IngestResult = { duplicate: boolean; movements: number };

/** A 422 naming the first failed rule, with every problem as an issue. */
function implausible(problems: readonly Problem[]): Error {
  const first = problems[0]!;
  return unprocessable(`implausible sequence (${first.rule}): ${first.message}`, problems.map((p) => ({ path: `batch.${p.rule}`, message: p.message })));
}

/**
 * Decodes and checks an upload's stream (decodeStream): base64 → gzip, decompressed as a stream
 * under a cap from the declared sample count (inspectGzipStream), then checked against the
 * movements (streamProblems). Returns the gzip bytes to store as they came (the export
 * re-encodes them).
 * @throws AppError 422 naming what is wrong.
 */
export async function decodeStream(batch: SequenceBatch): Promise<Buffer> {
  const gz = Buffer.from(batch.stream.gzipBase64, "base64");
  let facts;
  try {
    facts = await inspectGzipStream(gz, batch.stream.sampleCount);
  } catch (e) {
    if (e instanceof StreamRefusal) {
      const message = `stream: ${e.message} (stopped after ${e.inflatedBytes} decompressed bytes)`;
      throw unprocessable(message, [{ path: "batch.stream", message }]);
    }
    throw e;
  }
  const problems = streamProblems(batch, facts);
  if (problems.length > 0) throw implausible(problems);
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
  if (problems.length > 0) throw implausible(problems);
  const gz = await decodeStream(batch);
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
