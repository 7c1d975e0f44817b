import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { gunzipSync, gzipSync } from "node:zlib";
import { parse } from "csv-parse/sync";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { FINISHED_STUDY } from "@/db/seeds/demo-finished-study";
import { seedDemo } from "@/db/seeds/demo";
import { db } from "@/lib/db";
import { databaseArchiveSource } from "@/lib/data/exports";
import { randomPseudonyms, writeArchive, type ExportOptions } from "@/lib/export";
import { readZip } from "../fixtures/readZip";

// What an archive could give away beyond its tables' values: the order of its rows, the raw
// streams' bytes, and combinations of columns (k-anonymity), against the finished demo study.

const dir = mkdtempSync(join(tmpdir(), "yawpoint-archive-leaks-"));
let studyId = 0;
const OPTIONS: ExportOptions = { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: false };

async function archive(name: string, options: ExportOptions = OPTIONS) {
  const source = await databaseArchiveSource(db, studyId);
  const path = join(dir, `${name}.zip`);
  const summary = await writeArchive(source, options, randomPseudonyms(source.participants.map((p) => p.id)), path);
  return { summary, files: await readZip(path) };
}
const csv = (files: Map<string, Buffer>, name: string) => parse(files.get(name)!.toString("utf8"), { columns: true }) as Record<string, string>[];
const firstAppearances = (rows: Record<string, string>[]) => [...new Set(rows.map((r) => r.participant!))];
const sorted = (xs: string[]) => [...xs].sort();

beforeAll(async () => {
  await seedDemo(db);
  studyId = (await db("studies").where({ title: FINISHED_STUDY.title }).first<{ id: number }>("id")).id;
});
afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
  await db.destroy();
});

describe("row order", () => {
  it("attack: rows in database order would link random pseudonyms across archives; every table is in pseudonym order", async () => {
    const a = await archive("order-a");
    const b = await archive("order-b");
    for (const { files } of [a, b]) {
      const people = csv(files, "participants.csv").map((r) => r.participant!);
      expect(people.length).toBe(12);
      expect(people).toEqual(sorted(people));
      expect(firstAppearances(csv(files, "trials.csv"))).toEqual(sorted(firstAppearances(csv(files, "trials.csv"))));
      expect(firstAppearances(csv(files, "questionnaires.csv"))).toEqual(sorted(firstAppearances(csv(files, "questionnaires.csv"))));
      const streamOwners = [...new Set([...files.keys()].filter((n) => n.startsWith("streams/")).map((n) => n.split("/")[1]!))];
      expect(streamOwners).toEqual(sorted(streamOwners));
    }
  }, 120_000);
});

describe("raw streams", () => {
  it("attack: a stream stored with a file name and time stamp in its gzip header and a column of its own leaves re-encoded: a plain header, only the format's columns", async () => {
    const row = await db("sequence_streams as s").join("participants as p", "p.id", "s.participant_id").where("p.study_id", studyId).orderBy("s.id").first<{ id: number; stream_gz: Buffer }>("s.id", "s.stream_gz");
    const original = gunzipSync(row.stream_gz).toString("utf8");
    const lines = original.trimEnd().split("\n");
    const tagged = [`${lines[0]},note`, ...lines.slice(1).map((l) => `${l},lena.virtanen@mailbox.example`)].join("\n") + "\n";
    // RFC 1952 §2.3: FLG.FNAME (0x08) with a zero-terminated name, MTIME a real time; body and trailer from zlib
    const plain = gzipSync(tagged);
    const name = Buffer.from("lena-virtanen-session.csv\0", "latin1");
    const header = Buffer.from([0x1f, 0x8b, 0x08, 0x08, 0, 0, 0, 0, 0x00, 0x03]);
    header.writeUInt32LE(Math.floor(Date.UTC(2026, 11, 3, 14, 7, 12) / 1000), 4);
    const hostile = Buffer.concat([header, name, plain.subarray(10)]);
    expect(gunzipSync(hostile).toString("utf8")).toBe(tagged);
    await db("sequence_streams").where({ id: row.id }).update({ stream_gz: hostile });
    try {
      const { files } = await archive("streams");
      const streams = [...files].filter(([n]) => n.startsWith("streams/"));
      expect(streams.length).toBeGreaterThan(0);
      for (const [n, gz] of streams) {
        expect(gz.readUInt32LE(4), `${n}: MTIME`).toBe(0);
        expect(gz[3]! & 0x1e, `${n}: FLG has no FTEXT/FHCRC/FEXTRA/FNAME/FCOMMENT`).toBe(0);
        const text = gunzipSync(gz).toString("utf8");
        expect(text.startsWith("t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle")).toBe(true);
        expect(text).not.toContain("note");
        expect(text).not.toContain("lena");
      }
      expect([...files.values()].some((buf) => buf.includes(Buffer.from("lena-virtanen")))).toBe(false);
    } finally {
      await db("sequence_streams").where({ id: row.id }).update({ stream_gz: row.stream_gz });
    }
  }, 120_000);
});

describe("k-anonymity", () => {
  it("counts every quasi-identifier participants.csv writes: the session's minutes, and its dates when included", async () => {
    const without = await archive("k-no-dates", { ...OPTIONS, includeStreams: false });
    expect(without.summary.kAnonymity.quasiIdentifiers).toEqual(expect.arrayContaining(["age_band", "handedness", "experience", "session_minutes"]));
    expect(without.summary.kAnonymity.quasiIdentifiers).not.toContain("started_at");
    const withDates = await archive("k-dates", { ...OPTIONS, includeStreams: false, includeDates: true });
    expect(withDates.summary.kAnonymity.quasiIdentifiers).toEqual(expect.arrayContaining(["session_minutes", "started_at", "completed_at"]));
    // each demo session started at its own time: with dates, every participant stands alone (k = 1), and the archive warns
    const starts = csv(withDates.files, "participants.csv").map((r) => r.started_at);
    expect(new Set(starts).size).toBe(starts.length);
    expect(withDates.summary.kAnonymity.k).toBe(1);
    expect(withDates.summary.warnings.some((w) => /only 1-anonymous/.test(w) && /started_at/.test(w))).toBe(true);
  }, 120_000);
});
