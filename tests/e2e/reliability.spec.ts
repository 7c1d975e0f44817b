import { execFileSync } from "node:child_process";
import { existsSync, readdirSync, rmSync } from "node:fs";
import { join, resolve } from "node:path";
import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { createUploader, type UploadStatus } from "../../components/participant/uploader";
import type { QueuedBatch, SessionStore } from "../../components/participant/store";
import { planSession, type SessionState } from "../../lib/runner";
import { studyDesignSchema } from "../../lib/study/design";
import { demo, apiAs } from "./helpers";
import { dropOwnDatabase, ownDatabase, prepareOwnDatabase } from "./fixtures/own-database";
import { batchFor } from "./fixtures/session-batch";
import { startServer } from "./fixtures/session-server";
import { createSessionStudy, motionDesign } from "./fixtures/session-study";

// Reliability, on a MariaDB and a server of this spec's own (never the run's shared ones, which
// other specs use meanwhile): the database restarted in the middle of a session's uploads loses
// and doubles nothing, and a server killed in the middle of an export leaves the job failed with
// no partial archive offered. Both are stopped and removed afterwards.

const DB_PORT = Number(process.env.DB_PORT ?? 3307) + 5;
const DATA_DIR = `/tmp/yawpoint-reliability-${DB_PORT}`;
const SERVER_PORT = Number(process.env.PORT ?? 3100) + 60;
const dbEnv = { DB_PORT: String(DB_PORT), DB_DATA_DIR: DATA_DIR };
const mariadb = (command: "up" | "stop") => execFileSync("npx", ["tsx", "scripts/db.ts", command], { env: { ...process.env, ...dbEnv, DB_NAME: dbName }, stdio: ["ignore", "ignore", "inherit"] });
const EXPORTS = resolve(`/tmp/yawpoint-reliability-exports-${SERVER_PORT}`);

let dbName = "";
let owner: Knex;
let server: { url: string; stop: () => void; pid: number } | null = null;
let serverEnv: Record<string, string> = {};

test.describe.configure({ mode: "serial", timeout: 240_000 });

test.beforeAll(async () => {
  test.setTimeout(300_000);
  const own = prepareOwnDatabase("reliability", { seed: true, env: dbEnv });
  dbName = own.name;
  owner = ownDatabase(dbName, DB_PORT);
  // a short stale time, so a lost export is noticed within the test (the default is 120 s)
  serverEnv = { ...own.env, WEB_CONCURRENCY: "1", EXPORTS_DIR: EXPORTS, EXPORT_STALE_SECONDS: "30" };
  server = await startServer(SERVER_PORT, serverEnv);
});

test.afterAll(async () => {
  server?.stop();
  if (owner) {
    await dropOwnDatabase(owner, dbName).catch(() => {});
    await owner.destroy();
  }
  mariadb("stop");
  rmSync(DATA_DIR, { recursive: true, force: true });
  rmSync(`${DATA_DIR}.log`, { force: true });
  rmSync(EXPORTS, { recursive: true, force: true });
});

/** The runner's queue as the browser keeps it (IndexedDB there), in memory here: the same interface. */
function memoryStore(batches: QueuedBatch[]): SessionStore {
  const queue = new Map(batches.map((b) => [b.key, b]));
  return {
    progress: async () => undefined,
    saveProgress: async () => undefined,
    saveMovement: async () => undefined,
    finishSequence: async (batch) => void queue.set(batch.key, { key: batch.key, batch, state: "pending", attempts: 0 }),
    batches: async () => [...queue.values()],
    update: async (b) => void queue.set(b.key, b),
    remove: async (key) => void queue.delete(key),
    clear: async () => queue.clear(),
  };
}

test("MariaDB restarted in the middle of a session's uploads: the runner's retries store every sequence exactly once", async () => {
  const design = studyDesignSchema.parse({ ...motionDesign, blocks: 3 });
  const fx = await createSessionStudy(owner, `Reliability upload ${Date.now()}`, design, 1);
  const p = fx.participants[0]!;
  const url = server!.url;
  const consent = await fetch(`${url}/api/session/${p.token}/consent`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: "Reliability Person", screenShortSidePx: 800 }) });
  expect(consent.status, await consent.text()).toBe(201);
  expect((await fetch(`${url}/api/session/${p.token}/start`, { method: "POST" })).status).toBe(200);
  const state = (await (await fetch(`${url}/api/session/${p.token}`)).json()) as SessionState;
  const plan = planSession(design, state.order!, state.planSeed!);
  expect(plan.length).toBeGreaterThanOrEqual(6);

  // the uploader runs as in the browser: its fetch of the session's own paths, its "online" event
  const realFetch = globalThis.fetch;
  let sent = 0;
  globalThis.fetch = ((input: RequestInfo | URL, init?: RequestInit) => {
    sent++;
    return realFetch(typeof input === "string" && input.startsWith("/") ? `${url}${input}` : input, init);
  }) as typeof fetch;
  (globalThis as { window?: EventTarget }).window ??= new EventTarget();
  const store = memoryStore([]);
  const statuses: UploadStatus[] = [];
  const uploader = createUploader(p.token, store, (s) => void statuses.push(s));
  try {
    // the first sequences go through
    const half = Math.floor(plan.length / 2);
    for (const s of plan.slice(0, half)) await store.finishSequence(batchFor(design, p.id, s), { stage: "task", done: 0, answered: [], breaks: [] } as never);
    uploader.kick();
    await expect.poll(async () => (await store.batches()).length, { timeout: 30_000 }).toBe(0);

    // the database goes away while the rest are recorded and sent
    mariadb("stop");
    for (const s of plan.slice(half)) await store.finishSequence(batchFor(design, p.id, s), { stage: "task", done: 0, answered: [], breaks: [] } as never);
    uploader.kick();
    await expect.poll(() => statuses.at(-1)?.waiting ?? false, { timeout: 60_000 }).toBe(true); // refused for now, kept, retried later
    const triedWhileDown = sent;
    expect((await store.batches()).length).toBe(plan.length - half);
    await new Promise((r) => setTimeout(r, 3000));
    mariadb("up");
    // the queue drains by itself (backoff up to 30 s between tries)
    await expect.poll(async () => (await store.batches()).length, { timeout: 90_000, intervals: [1000] }).toBe(0);
    expect(sent).toBeGreaterThan(triedWhileDown);
  } finally {
    uploader.stop();
    globalThis.fetch = realFetch;
  }

  // every planned sequence once, with its movements once
  const rows = await owner("sequence_streams").where({ participant_id: p.id }).select<{ upload_key: string }[]>("upload_key");
  expect(rows.map((r) => r.upload_key).sort()).toEqual(plan.map((s) => batchFor(design, p.id, s).key).sort());
  const [{ n: trials }] = (await owner("trials").where({ participant_id: p.id }).count({ n: "*" })) as [{ n: number }];
  expect(Number(trials)).toBe(plan.reduce((a, s) => a + batchFor(design, p.id, s).movements.length, 0));
  // and the session finishes: the completion code is given
  const done = await fetch(`${url}/api/session/${p.token}/complete`, { method: "POST", headers: { "content-type": "application/json" }, body: "{}" });
  expect(done.status, await done.clone().text()).toBe(200);
});

test("a server killed in the middle of an export: the job ends failed and no partial archive is offered", async () => {
  const researcher = await apiAs(demo("researcher").email, demo("researcher").password, server!.url);
  // the seeded finished study: twelve simulated participants with their raw streams
  const study = await owner("studies").where({ status: "closed" }).orWhere("title", "like", "%finished pilot%").first<{ id: number }>("id");
  expect(study).toBeDefined();
  const start = await researcher.post(`/api/studies/${study!.id}/exports`, { data: { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: false } });
  expect(start.status(), await start.text()).toBe(202);
  const { export: { id: jobId } } = (await start.json()) as { export: { id: number } };
  // killed while the archive is being written: its partial file is there, the job not finished
  const files = (dir: string): string[] => (existsSync(dir) ? readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? files(join(dir, d.name)) : [d.name])) : []);
  const partial = (f: string) => f.startsWith(`export-${jobId}-`) && f.endsWith(".part");
  await expect.poll(() => files(EXPORTS).some(partial), { timeout: 60_000, intervals: [20] }).toBe(true);
  process.kill(-server!.pid, "SIGKILL"); // the server and the export process it started, at once
  await researcher.dispose();
  const killedAt = Date.now();
  await expect.poll(() => fetch(`${server!.url}/api/health`).then(() => "up", () => "down"), { timeout: 10_000 }).toBe("down");
  const row = await owner("exports").where({ id: jobId }).first<{ status: string; path: string | null }>("status", "path");
  expect(row).toMatchObject({ status: "running", path: null }); // it was killed mid-way, not after

  server = await startServer(SERVER_PORT, serverEnv);
  const again = await apiAs(demo("researcher").email, demo("researcher").password, server.url);
  // while it might still be alive somewhere it is not offered; once silent past the stale time it is failed
  expect((await again.get(`/api/exports/${jobId}/download`)).status()).toBe(409);
  await new Promise((r) => setTimeout(r, Math.max(0, killedAt + 32_000 - Date.now())));
  const next = await again.post(`/api/studies/${study!.id}/exports`, { data: { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false } }); // a researcher starting a new one
  expect(next.status()).toBe(202);
  await expect.poll(async () => (await owner("exports").where({ id: jobId }).first<{ status: string }>("status"))!.status, { timeout: 30_000 }).toBe("failed");
  const failed = await owner("exports").where({ id: jobId }).first<{ error: string; path: string | null }>("error", "path");
  expect(failed!.error).toMatch(/stopped without finishing/);
  expect(failed!.path).toBeNull();
  const download = await again.get(`/api/exports/${jobId}/download`);
  expect(download.status()).toBe(409);
  expect(((await download.json()) as { error: { message: string } }).error.message).toMatch(/failed/);
  // no file of the killed job is left in the exports folder, finished or partial
  expect(files(EXPORTS).filter((f) => f.startsWith(`export-${jobId}-`))).toEqual([]);
  expect(await owner("audit_log").where({ action: "export.fail", study_id: study!.id }).count({ n: "*" })).toEqual([{ n: 1 }]);
  await again.dispose();
});
