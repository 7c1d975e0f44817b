import { gzipSync } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { admitUpload, uploadLinkLimit } from "@/lib/auth/rate-limit";
import { INFLATE_CHUNK_BYTES, streamByteCap } from "@/lib/ingest/inspectStream";
import { seedDemo } from "@/db/seeds/demo";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { completeSession, fetchSessionByToken, recordConsent, withdrawParticipant, planOf, type SessionContext } from "@/lib/data/participants";
import { startTasks } from "@/lib/data/places";
import { ingestSequenceBatch } from "@/lib/data/recording";
import { forgetUploadSession, requireUploadSession } from "@/lib/data/uploadSessions";
import { studyDesignSchema } from "@/lib/study/design";
import { verifyAuditChain } from "@/lib/data/audit";
import { createSessionStudy, motionDesign, touchDesign, type SessionFixture } from "../e2e/fixtures/session-study";
import { batchFor } from "../e2e/fixtures/session-batch";

// The ingest data functions against MariaDB: idempotent by upload key (also under concurrent
// repeats), refusal after withdrawal, erasure by the study's rule, the audit chain intact.

let fx: SessionFixture;
let keep: SessionFixture;
const design = studyDesignSchema.parse(motionDesign);

async function consented(token: string): Promise<SessionContext> {
  const ctx = (await fetchSessionByToken(db, token))!;
  await recordConsent(db, ctx, { consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: "Robin Example", screenShortSidePx: 700 }, "Mozilla/5.0 (X11; Linux x86_64) Chrome/140");
  await startTasks(db, (await fetchSessionByToken(db, token))!); // the order comes with a place when the tasks start
  return (await fetchSessionByToken(db, token))!;
}

async function status(p: Promise<unknown>): Promise<number> {
  try {
    await p;
    return 200;
  } catch (e) {
    if (e instanceof AppError) return e.status;
    throw e;
  }
}

beforeAll(async () => {
  await seedDemo(db);
  fx = await createSessionStudy(db, "Ingest test", motionDesign, 3);
  keep = await createSessionStudy(db, "Ingest keep-data test", touchDesign, 1);
});
afterAll(() => db.destroy());

describe("ingestSequenceBatch", () => {
  it("stores a sequence once, even when the same key arrives many times at once", async () => {
    const ctx = await consented(fx.participants[0]!.token);
    const plan = planOf(ctx)!;
    const batch = batchFor(design, ctx.participant.id, plan[0]!);
    const results = await Promise.all(Array.from({ length: 8 }, () => ingestSequenceBatch(db, ctx, batch)));
    expect(results.filter((r) => !r.duplicate)).toHaveLength(1);
    expect(await db("trials").where({ participant_id: ctx.participant.id }).count({ n: "*" })).toEqual([{ n: 13 }]);
    expect(await db("sequence_streams").where({ participant_id: ctx.participant.id }).count({ n: "*" })).toEqual([{ n: 1 }]);
    const row = await db("participants").where({ id: ctx.participant.id }).first();
    expect(row.status).toBe("in_progress");
  });

  it("stores every movement field exactly as uploaded (doubles round-trip through the database unchanged)", async () => {
    const ctx = (await fetchSessionByToken(db, fx.participants[0]!.token))!;
    const plan = planOf(ctx)!;
    const base = batchFor(design, ctx.participant.id, plan[1]!);
    // Awkward IEEE 754 doubles (0.1 + 0.2, 1/3, a subnormal-adjacent value): each must come back bit for bit.
    const odd = [0.1 + 0.2, 1 / 3, -1.23456789e-5, 2.2250738585072014e-308, 12345.678901234567];
    // (every fourth a miss, a width beside the target; each movement starts where the last ended, as the runner records them)
    const ends = base.movements.map((m, i) => ({ x: m.end_x + odd[i % 4]! + (i % 4 === 3 ? base.width : 0), y: m.end_y - odd[(i + 2) % 4]! }));
    const movements = base.movements.map((m, i) => ({ ...m, start_x: i === 0 ? m.start_x : ends[i - 1]!.x, start_y: i === 0 ? m.start_y : ends[i - 1]!.y, end_x: ends[i]!.x, end_y: ends[i]!.y, time_ms: 700 + odd[(i + 1) % odd.length]! / 100, hit: (i % 4 === 3 ? 0 : 1) as 0 | 1, timed_out: (i === 5 ? 1 : 0) as 0 | 1, recentered: (i % 3 === 1 ? 1 : 0) as 0 | 1, clutched: (i % 5 === 2 ? 1 : 0) as 0 | 1 }));
    expect(await ingestSequenceBatch(db, ctx, { ...base, movements })).toEqual({ duplicate: false, movements: movements.length });
    const rows = await db("trials").where({ upload_key: base.key }).orderBy("trial");
    expect(rows.map((r) => ({ trial: r.trial, from_x: r.from_x, from_y: r.from_y, to_x: r.to_x, to_y: r.to_y, start_x: r.start_x, start_y: r.start_y, end_x: r.end_x, end_y: r.end_y, time_ms: r.time_ms, hit: r.hit ? 1 : 0, timed_out: r.timed_out ? 1 : 0, recentered: r.recentered ? 1 : 0, clutched: r.clutched ? 1 : 0 }))).toEqual(movements);
    expect(rows.every((r) => r.participant_id === ctx.participant.id && r.condition === base.condition && r.block === base.block && r.sequence === base.sequence && r.amplitude === base.amplitude && r.width === base.width && r.unit === base.unit && !r.practice === !base.practice)).toBe(true);
    const stream = await db("sequence_streams").where({ upload_key: base.key }).first();
    expect(stream.movement_count).toBe(movements.length);
    expect(Buffer.compare(stream.stream_gz, Buffer.from(base.stream.gzipBase64, "base64"))).toBe(0);
  });

  it("refuses an implausible batch (422) and a session without consent (409)", async () => {
    const ctx = await consented(fx.participants[1]!.token);
    const plan = planOf(ctx)!;
    const batch = batchFor(design, ctx.participant.id, plan[1]!);
    expect(await status(ingestSequenceBatch(db, ctx, { ...batch, amplitude: 299 }))).toBe(422);
    expect(await status(ingestSequenceBatch(db, ctx, { ...batch, stream: { ...batch.stream, sampleCount: 5 } }))).toBe(422);
    const fresh = (await fetchSessionByToken(db, fx.participants[2]!.token))!;
    expect(await status(ingestSequenceBatch(db, fresh, batch))).toBe(409);
  });

  it("attack: a made-up sequence (centres hit 1 ms apart, a stub stream) is refused naming the rule, and nothing is written", async () => {
    const ctx = (await fetchSessionByToken(db, fx.participants[1]!.token))!;
    const plan = planOf(ctx)!;
    const real = batchFor(design, ctx.participant.id, plan[2]!);
    const made = {
      ...real,
      movements: real.movements.map((m) => ({ ...m, start_x: m.from_x, start_y: m.from_y, end_x: m.to_x, end_y: m.to_y, time_ms: 1, hit: 1 as const })),
      stream: { gzipBase64: gzipSync("t_ms,gyro_x,gyro_y,gyro_z\n0,0,0,0\n").toString("base64"), sampleCount: 1 },
    };
    const refusal = await ingestSequenceBatch(db, ctx, made).catch((e: unknown) => e as AppError);
    expect(refusal).toBeInstanceOf(AppError);
    expect((refusal as AppError).status).toBe(422);
    expect((refusal as AppError).message).toMatch(/implausible sequence \((time|start)\)/);
    // movements right, stream made up: the stream's rules name it
    const stub = { ...real, stream: made.stream };
    expect(((await ingestSequenceBatch(db, ctx, stub).catch((e: unknown) => e)) as AppError).message).toMatch(/\((stream-span|sample-rate)\)/);
    expect(await db("sequence_streams").where({ upload_key: real.key }).count({ n: "*" })).toEqual([{ n: 0 }]);
  });

  it("attack: a gzip bomb (tens of KB inflating to 16 MB) is refused after at most the cap its sample count allows", async () => {
    const ctx = (await fetchSessionByToken(db, fx.participants[1]!.token))!;
    const real = batchFor(design, ctx.participant.id, planOf(ctx)![2]!);
    const line = "0,0,0,0,,,,,,,0\n";
    const bomb = gzipSync("t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle\n" + line.repeat(Math.ceil((16 << 20) / line.length)), { level: 9 });
    expect(bomb.length).toBeLessThan(64 << 10);
    const refusal = (await ingestSequenceBatch(db, ctx, { ...real, stream: { gzipBase64: bomb.toString("base64"), sampleCount: real.stream.sampleCount } }).catch((e: unknown) => e)) as AppError;
    expect(refusal.status).toBe(422);
    const stopped = Number(/stopped after (\d+) decompressed bytes/.exec(refusal.message)?.[1]);
    expect(stopped).toBeLessThanOrEqual(streamByteCap(real.stream.sampleCount) + INFLATE_CHUNK_BYTES);
  });

  it("attack: a flood of uploads on one link is counted atomically; past the limit each waits for the next minute", async () => {
    const ctx = (await fetchSessionByToken(db, fx.participants[1]!.token))!;
    const now = Date.now();
    const waits = await Promise.all(Array.from({ length: 200 }, () => admitUpload(db, ctx.participant.id, now)));
    expect(waits.filter((w) => w === null)).toHaveLength(uploadLinkLimit().max);
    expect(waits.filter((w) => w !== null).every((w) => w! >= 1 && w! <= 60)).toBe(true);
    // another link is not held up by this one
    expect(await admitUpload(db, ctx.participant.id + 100_000, now)).toBeNull();
  });

  it("after withdrawal refuses further uploads with 410 and erases earlier data when the study says so", async () => {
    const ctx = (await fetchSessionByToken(db, fx.participants[1]!.token))!;
    const plan = planOf(ctx)!;
    expect((await ingestSequenceBatch(db, ctx, batchFor(design, ctx.participant.id, plan[1]!))).duplicate).toBe(false);
    expect(await withdrawParticipant(db, ctx, "test")).toEqual({ erased: true });
    const after = (await fetchSessionByToken(db, fx.participants[1]!.token))!;
    expect(await status(ingestSequenceBatch(db, after, batchFor(design, ctx.participant.id, plan[2]!)))).toBe(410);
    // even a request that read the session before the withdrawal is refused inside the transaction
    expect(await status(ingestSequenceBatch(db, ctx, batchFor(design, ctx.participant.id, plan[2]!)))).toBe(410);
    expect(await db("trials").where({ participant_id: ctx.participant.id }).count({ n: "*" })).toEqual([{ n: 0 }]);
    expect((await db("consent_records").where({ participant_id: ctx.participant.id }).first()).withdrawn_at).not.toBeNull();
    expect((await verifyAuditChain(db)).intact).toBe(true);
  });

  it("a session remembered for uploads is refused all the same once withdrawn; a session without consent is not remembered", async () => {
    const token = fx.participants[2]!.token;
    const before = await requireUploadSession(db, token);
    expect(before.participant.status).toBe("invited");
    expect(await requireUploadSession(db, token)).not.toBe(before); // read again: nothing to reuse before consent
    await consented(token);
    const ctx = await requireUploadSession(db, token);
    expect(await requireUploadSession(db, token)).toBe(ctx); // reused
    const plan = planOf(ctx)!;
    expect((await ingestSequenceBatch(db, ctx, batchFor(design, ctx.participant.id, plan[0]!))).duplicate).toBe(false);
    await withdrawParticipant(db, ctx, "test");
    const stale = await requireUploadSession(db, token);
    expect(stale).toBe(ctx); // still the remembered, pre-withdrawal context
    expect(await status(ingestSequenceBatch(db, stale, batchFor(design, ctx.participant.id, plan[1]!)))).toBe(410);
    forgetUploadSession(token);
    expect((await requireUploadSession(db, token)).participant.status).toBe("withdrawn");
  });

  it("refuses uploads from a completed session (409), even from a request that read the session before completion", async () => {
    const extra = await createSessionStudy(db, "Ingest after completion", motionDesign, 1);
    const ctx = (await fetchSessionByToken(db, extra.participants[0]!.token))!;
    await recordConsent(db, ctx, { consentVersionId: extra.consentVersionId, versionHash: extra.consentHash, agreed: ["s1", "s2", "s3"], typedName: "Robin Example", screenShortSidePx: 700 }, null);
    await startTasks(db, (await fetchSessionByToken(db, extra.participants[0]!.token))!);
    const live = (await fetchSessionByToken(db, extra.participants[0]!.token))!;
    const plan = planOf(live)!;
    for (const s of plan.filter((x) => !x.practice)) await ingestSequenceBatch(db, live, batchFor(design, live.participant.id, s));
    await completeSession(db, live);
    const practice = plan.find((x) => x.practice)!;
    expect(await status(ingestSequenceBatch(db, live, batchFor(design, live.participant.id, practice)))).toBe(409);
    expect(await db("sequence_streams").where({ participant_id: live.participant.id, practice: true }).count({ n: "*" })).toEqual([{ n: 0 }]);
  });

  it("keeps earlier data on withdrawal when the study's rule says keep", async () => {
    const ctx = (await fetchSessionByToken(db, keep.participants[0]!.token))!;
    await recordConsent(db, ctx, { consentVersionId: keep.consentVersionId, versionHash: keep.consentHash, agreed: ["s1", "s2", "s3"], screenShortSidePx: 400 }, null);
    await startTasks(db, (await fetchSessionByToken(db, keep.participants[0]!.token))!);
    const c2 = (await fetchSessionByToken(db, keep.participants[0]!.token))!;
    const touch = studyDesignSchema.parse(touchDesign);
    await ingestSequenceBatch(db, c2, batchFor(touch, c2.participant.id, planOf(c2)![0]!));
    expect(await withdrawParticipant(db, c2)).toEqual({ erased: false });
    expect(await db("trials").where({ participant_id: c2.participant.id }).count({ n: "*" })).toEqual([{ n: 9 }]);
    const audit = await db("audit_log").where({ action: "participant.withdrawn", study_id: keep.studyId }).first();
    expect(JSON.parse(typeof audit.details === "string" ? audit.details : JSON.stringify(audit.details)).erased).toBe(false);
  });
});
