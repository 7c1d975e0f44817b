import { existsSync, mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import type { SessionUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { exportsRoot, studyExportDir } from "@/lib/data/exportFiles";
import { fetchExportFile, fetchExportJob, insertExportJob } from "@/lib/data/exports";
import { claimExports, dispatchExports, MAX_UNFINISHED_PER_STUDY, requestExport, STALE_AFTER_MS, sweepExpiredExports } from "@/lib/data/exportQueue";
import { addTeamMember } from "@/lib/data/studies";
import { insertUser } from "@/lib/data/users";
import { env } from "@/lib/env";
import type { ExportOptions } from "@/lib/export";
import { createSessionStudy, motionDesign } from "../e2e/fixtures/session-study";

// Export permissions, the server-wide queue and the retention period (lib/data/exportQueue.ts), against MariaDB.

const OPTIONS: ExportOptions = { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false };
const DAY = 24 * 60 * 60 * 1000;
let owner: SessionUser;

async function member(studyId: number, role: "viewer" | "editor"): Promise<SessionUser> {
  const email = `${role}.${studyId}.${Date.now()}@harbourview-lab.example`;
  const id = await insertUser(db, { email, name: `A ${role}`, role: "researcher", passwordHash: null });
  await addTeamMember(db, studyId, id, role);
  return { id, email, name: `A ${role}`, role: "researcher" };
}
const jobsOf = (studyId: number) => db("exports").where({ study_id: studyId }).select<{ id: number; status: string }[]>("id", "status");
const statusOf = async (id: number) => (await db("exports").where({ id }).first<{ status: string }>("status")).status;

beforeAll(async () => {
  await seedDemo(db);
  const row = await db("users").where({ email: "tomas@harbourview-lab.example" }).first();
  owner = { id: row.id, email: row.email, name: row.name, role: "researcher" };
  // this file reasons about the whole server's queue: nothing of earlier files may be waiting
  await db("exports").whereIn("status", ["queued", "running"]).update({ status: "failed", error: "left by an earlier test file" });
});
afterAll(() => db.destroy());

describe("who may export", () => {
  it("attack: a viewer of the study cannot start an export (403, nothing queued, nothing audited); an editor can", async () => {
    const fx = await createSessionStudy(db, "Export by a viewer", motionDesign, 0);
    const viewer = await member(fx.studyId, "viewer");
    const before = await db("audit_log").where({ study_id: fx.studyId }).count({ n: "*" });
    await expect(requestExport(db, viewer, fx.studyId, OPTIONS)).rejects.toMatchObject({ status: 403 });
    await expect(Promise.all(Array.from({ length: 20 }, () => requestExport(db, viewer, fx.studyId, OPTIONS)))).rejects.toMatchObject({ status: 403 });
    expect(await jobsOf(fx.studyId)).toEqual([]);
    expect(await db("audit_log").where({ study_id: fx.studyId }).count({ n: "*" })).toEqual(before);
    const editor = await member(fx.studyId, "editor");
    const id = await requestExport(db, editor, fx.studyId, OPTIONS);
    expect(await statusOf(id)).toBe("queued");
    expect(await db("audit_log").where({ study_id: fx.studyId, action: "export.start" }).count({ n: "*" })).toEqual([{ n: 1 }]);
    await db("exports").where({ id }).update({ status: "failed" });
  });

  it("attack: a flood of requests for one study queues at most the study's limit; the rest are refused with 409", async () => {
    const fx = await createSessionStudy(db, "Export flood", motionDesign, 0);
    const outcomes = await Promise.allSettled(Array.from({ length: 25 }, () => requestExport(db, owner, fx.studyId, OPTIONS)));
    expect(outcomes.filter((o) => o.status === "fulfilled")).toHaveLength(MAX_UNFINISHED_PER_STUDY);
    expect(outcomes.filter((o) => o.status === "rejected").every((o) => (o as PromiseRejectedResult).reason.status === 409)).toBe(true);
    expect(await jobsOf(fx.studyId)).toHaveLength(MAX_UNFINISHED_PER_STUDY);
    await db("exports").where({ study_id: fx.studyId }).update({ status: "failed" });
  });
});

describe("the queue", () => {
  it("runs at most the server's capacity at once and one job per study; the rest start as others end", async () => {
    const a = await createSessionStudy(db, "Queue study A", motionDesign, 0);
    const b = await createSessionStudy(db, "Queue study B", motionDesign, 0);
    const c = await createSessionStudy(db, "Queue study C", motionDesign, 0);
    const a1 = await requestExport(db, owner, a.studyId, OPTIONS);
    const a2 = await requestExport(db, owner, a.studyId, OPTIONS);
    const b1 = await requestExport(db, owner, b.studyId, OPTIONS);
    const c1 = await requestExport(db, owner, c.studyId, OPTIONS);
    // a stand-in for the export process: it "runs" until the test lets it finish
    const finish = new Map<number, () => void>();
    let peak = 0;
    const run = async (_db: typeof db, jobId: number): Promise<void> => {
      const running = await db("exports").where({ status: "running" }).select<{ study_id: number }[]>("study_id");
      peak = Math.max(peak, running.length);
      expect(new Set(running.map((r) => r.study_id)).size).toBe(running.length); // never two of one study
      await new Promise<void>((done) => finish.set(jobId, done));
      await db("exports").where({ id: jobId }).update({ status: "done", finished_at: new Date() });
    };
    // many dispatchers at once (several server processes) start exactly two, of two studies
    const started = (await Promise.all(Array.from({ length: 6 }, () => dispatchExports(db, run, 2)))).flat();
    expect([...started].sort((x, y) => x - y)).toEqual([a1, b1]);
    expect(await statusOf(a2)).toBe("queued");
    expect(await statusOf(c1)).toBe("queued");
    await expect.poll(() => finish.size).toBe(2);
    finish.get(a1)!(); // A's first ends: the next in line is A's second (its study is free again)
    await expect.poll(() => statusOf(a2)).toBe("running");
    expect(await statusOf(c1)).toBe("queued");
    finish.get(b1)!();
    await expect.poll(() => statusOf(c1)).toBe("running");
    await expect.poll(() => finish.size).toBe(4);
    finish.get(a2)!();
    finish.get(c1)!();
    await expect.poll(async () => (await Promise.all([a1, a2, b1, c1].map(statusOf))).every((s) => s === "done")).toBe(true);
    expect(peak).toBeLessThanOrEqual(2);
  });

  it("attack: a dispatcher that claims while another's claim is not yet committed does not start a second job of that study", async () => {
    const fx = await createSessionStudy(db, "Queue race", motionDesign, 0);
    const first = await requestExport(db, owner, fx.studyId, OPTIONS);
    const second = await requestExport(db, owner, fx.studyId, OPTIONS);
    // another server's dispatcher has marked the first job running (and let go of the queue lock)
    // but has not committed yet: the claim below must wait for it, not read the older snapshot
    let commit!: () => void;
    const held = new Promise<void>((r) => (commit = r));
    const marked = new Promise<void>((markedDone) => {
      void db.transaction(async (trx) => {
        await trx("exports").where({ id: first }).update({ status: "running", stage: "starting", started_at: new Date(), heartbeat_at: new Date() });
        markedDone();
        await held;
      });
    });
    await marked;
    const claiming = claimExports(db, 5);
    setTimeout(commit, 500);
    expect((await claiming).map((c) => c.id)).not.toContain(second);
    expect(await statusOf(first)).toBe("running");
    expect(await statusOf(second)).toBe("queued");
    await db("exports").where({ study_id: fx.studyId }).update({ status: "failed" });
  });

  it("a running job whose process stopped beating (its server was killed) is failed, saying so, and its slot is free", async () => {
    const fx = await createSessionStudy(db, "Queue dead job", motionDesign, 0);
    const id = await requestExport(db, owner, fx.studyId, OPTIONS);
    const long = new Date(Date.now() - STALE_AFTER_MS - 60_000);
    await db("exports").where({ id }).update({ status: "running", started_at: long, heartbeat_at: long });
    mkdirSync(join(exportsRoot(), studyExportDir(fx.studyId)), { recursive: true });
    const part = join(exportsRoot(), studyExportDir(fx.studyId), `export-${id}-abc.zip.part`);
    writeFileSync(part, "half an archive");
    const next = await requestExport(db, owner, fx.studyId, OPTIONS);
    const claimed = await claimExports(db, 2);
    const job = (await fetchExportJob(db, id))!;
    expect(job.status).toBe("failed");
    expect(job.error).toMatch(/stopped without finishing/);
    expect(existsSync(part)).toBe(false);
    expect((await fetchExportFile(db, id))!.path).toBeNull();
    expect(claimed.map((c) => c.id)).toEqual([next]);
    await db("exports").where({ id: next }).update({ status: "failed" });
  });
});

describe("retention", () => {
  it(`deletes archive files ${env.EXPORT_RETENTION_DAYS} days after they were finished; the listing says when, and downloads stop at the end even before the sweep`, async () => {
    const fx = await createSessionStudy(db, "Export retention", motionDesign, 0);
    const dir = join(exportsRoot(), studyExportDir(fx.studyId));
    mkdirSync(dir, { recursive: true });
    const now = Date.now();
    const make = async (ageDays: number): Promise<{ id: number; file: string }> => {
      const id = await insertExportJob(db, { studyId: fx.studyId, options: OPTIONS, createdBy: owner.id });
      const rel = join(studyExportDir(fx.studyId), `export-${id}-test.zip`);
      writeFileSync(join(exportsRoot(), rel), "PK archive bytes");
      await db("exports").where({ id }).update({ status: "done", path: rel, finished_at: new Date(now - ageDays * DAY) });
      return { id, file: join(exportsRoot(), rel) };
    };
    const old = await make(env.EXPORT_RETENTION_DAYS + 1);
    const young = await make(env.EXPORT_RETENTION_DAYS - 1);
    // past the period and not yet swept: no longer offered
    expect(await fetchExportFile(db, old.id)).toMatchObject({ path: null, fileDeleted: true });
    expect((await fetchExportJob(db, young.id))!.deleteAfter).toBe(new Date(now + DAY).toISOString());
    expect(await sweepExpiredExports(db, new Date(now))).toBeGreaterThanOrEqual(1);
    expect(existsSync(old.file)).toBe(false);
    expect(existsSync(young.file)).toBe(true);
    const gone = (await fetchExportJob(db, old.id))!;
    expect(gone.fileDeletedAt).not.toBeNull();
    expect(gone.deleteAfter).toBeNull();
    expect(gone.sha256 === null || typeof gone.sha256 === "string").toBe(true);
    expect((await fetchExportFile(db, young.id))!.path).toBe(young.file);
  });
});
