// npm run bench:ingest — sequence uploads from 50 concurrent simulated sessions on loopback.
// Starts the production server (scripts/serve.ts; WEB_CONCURRENCY processes) on the built app (NEXT_DIST_DIR, PORT), creates a study with 50 invited
// participants directly in the database (DB_NAME), consents each through the API, then every
// session sends its whole plan (34 sequences × 13 movements, a 10 s stream at 60 Hz each) one
// batch after another, as the browser does, plus a repeat of every tenth batch (must be answered
// duplicate). Two kinds of round, each with one keep-alive connection per session and one request
// in flight per connection:
//  - capacity (closed loop, autocannon): every session sends its next batch as soon as the last is
//    answered; the server's most batches/s, with the latency that queueing at saturation brings;
//  - paced (the target): the sessions together send INGEST_RATE batches/s (default 250, above the
//    200 the target asks for), each session a batch every 50/250 s from a random phase
//    (pacedSessions.ts); latency counted from when each batch was due.
// Bounded: 50 × 37 requests per round, 60 s cap. A warm-up round (printed, not counted), then
// three rounds of each kind; figures per round and the medians. Afterwards the database must hold
// every movement exactly once.
// This is a harness (it needs the database to set up and to check), not domain logic.
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { loadavg } from "node:os";
import { performance } from "node:perf_hooks";
import autocannon from "autocannon";
import { planSession, type SessionState } from "../../lib/runner";
import { studyDesignSchema, type StudyDesignInput } from "../../lib/study/design";
import { createSessionStudy, fixtureDb, motionDesign } from "../../tests/e2e/fixtures/session-study";
import { batchFor } from "../../tests/e2e/fixtures/session-batch";
import { median, quantile, startServer } from "../../tests/e2e/fixtures/session-server";
import { pacedSessions } from "./pacedSessions";

const SESSIONS = 50, ROUNDS = Number(process.env.INGEST_ROUNDS ?? 3), CAP_MS = 60_000, RATE = Number(process.env.INGEST_RATE ?? 250);
// One round first that is not counted: a fresh server loads and compiles the route on its first
// requests (JIT warm-up), which a server that has been running does not do again. Its figures are printed.
const WARMUP_ROUNDS = Number(process.env.INGEST_WARMUP_ROUNDS ?? 1);
const benchDesign: StudyDesignInput = { ...motionDesign, blocks: 2, task: { ...motionDesign.task, amplitudes: [300, 200], widths: [30, 60], sequencesPerAW: 2 } };
const design = studyDesignSchema.parse(benchDesign);

/** CPU seconds (user + system) of the server on `port`: the listening process and its children (the cluster's workers), from /proc. */
function serverCpuSeconds(port: number): number | null {
  try {
    const out = execFileSync("ss", ["-ltnpH", `sport = :${port}`], { encoding: "utf8" });
    const pids = new Set([...out.matchAll(/pid=(\d+)/g)].map((m) => m[1]!));
    if (pids.size === 0) return null;
    const children = (pid: string): string[] => {
      try {
        return readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean);
      } catch {
        return [];
      }
    };
    for (const pid of [...pids]) for (const c of children(pid)) pids.add(c);
    let ticks = 0;
    for (const pid of pids) {
      const fields = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]!.split(" ");
      ticks += Number(fields[11]) + Number(fields[12]); // utime, stime in clock ticks (USER_HZ = 100)
    }
    return ticks / 100;
  } catch {
    return null;
  }
}
const generatorCpuSeconds = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
};

/** One round: closed loop when `rate` is null, else paced at `rate` batches/s in all. */
async function round(url: string, db: ReturnType<typeof fixtureDb>, r: number, rate: number | null) {
  const fx = await createSessionStudy(db, `Ingest bench ${Date.now()} ${r}`, benchDesign, SESSIONS);
  const sessions = await Promise.all(fx.participants.map(async (p) => {
    const res = await fetch(`${url}/api/session/${p.token}/consent`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: "Bench Person", screenShortSidePx: 800 }) });
    if (res.status !== 201) throw new Error(`consent: ${res.status} ${await res.text()}`);
    // the condition order comes with a counterbalancing place when the tasks start, not at consent
    const started = await fetch(`${url}/api/session/${p.token}/start`, { method: "POST" });
    if (started.status !== 200) throw new Error(`start: ${started.status} ${await started.text()}`);
    const state = (await (await fetch(`${url}/api/session/${p.token}`)).json()) as SessionState;
    const plan = planSession(design, state.order!, state.planSeed!);
    const bodies = plan.map((s) => JSON.stringify(batchFor(design, p.id, s, 600)));
    return { p, bodies: [...bodies, ...bodies.filter((_, i) => i % 10 === 0)] };
  }));
  const latencies: number[] = [];
  let created = 0, duplicates = 0, failed = 0, nextSession = 0;
  const serverCpu0 = serverCpuSeconds(port), generatorCpu0 = generatorCpuSeconds(), load0 = loadavg()[0]!;
  const perSession = sessions[0]!.bodies.length;
  // autocannon: one connection per session, each sending its session's batches one after another
  // (a request waits for the answer to the one before, as the browser's queue does). Connection i
  // takes session i when autocannon builds its first request; request k of a connection is batch k.
  const count = (status: number, body: string): void => {
    if (status === 201) created++;
    else if (status === 200 && (JSON.parse(body) as { duplicate?: boolean }).duplicate) duplicates++;
    else failed++;
  };
  type Ctx = { session?: number };
  const requests: autocannon.Request[] = Array.from({ length: perSession }, (_, k) => ({
    method: "POST" as const,
    setupRequest: (req: autocannon.Request, ctx: object) => {
      const context = ctx as Ctx;
      if (k === 0 || context.session === undefined) context.session = nextSession++;
      const s = sessions[context.session]!;
      return { ...req, path: `/api/session/${s.p.token}/sequences`, headers: { "content-type": "application/json" }, body: s.bodies[k]! };
    },
    onResponse: (status: number, body: string) => count(status, body),
  }));
  let elapsed: number;
  if (rate === null) {
    const t0 = performance.now();
    const instance = autocannon({ url, connections: SESSIONS, amount: SESSIONS * perSession, requests, timeout: 30 }, () => undefined);
    instance.on("response", (_client: unknown, _status: number, _bytes: number, ms: number) => void latencies.push(ms));
    const cap = setTimeout(() => instance.stop(), CAP_MS);
    await new Promise<void>((resolve) => instance.on("done", () => resolve()));
    clearTimeout(cap);
    elapsed = (performance.now() - t0) / 1000;
  } else {
    const paced = await pacedSessions(url, sessions.map((s) => ({ path: `/api/session/${s.p.token}/sequences`, bodies: s.bodies })), rate, CAP_MS, count);
    latencies.push(...paced.fromDue);
    elapsed = paced.elapsed;
  }
  const serverCpu1 = serverCpuSeconds(port), generatorCpu = generatorCpuSeconds() - generatorCpu0, load1 = loadavg()[0]!;
  const serverCpu = serverCpu0 !== null && serverCpu1 !== null ? serverCpu1 - serverCpu0 : null;
  const planned = sessions[0]!.bodies.length - Math.ceil((sessions[0]!.bodies.length) / 11);
  const ids = fx.participants.map((p) => p.id);
  const [{ n: trials }] = (await db("trials").whereIn("participant_id", ids).count({ n: "*" })) as [{ n: number }];
  const [{ n: streams }] = (await db("sequence_streams").whereIn("participant_id", ids).count({ n: "*" })) as [{ n: number }];
  const expectedBatches = SESSIONS * planned;
  return {
    requests: latencies.length, batchesPerS: latencies.length / elapsed, p50: quantile(latencies, 0.5), p99: quantile(latencies, 0.99),
    created, duplicates, failed, lost: expectedBatches - Number(streams), duplicatedRows: Number(trials) - Number(streams) * design.task.targetsPerRing,
    expectedBatches, elapsed, serverCpu, generatorCpu, load0, load1,
  };
}

const port = Number(process.env.PORT ?? 3204);
// INGEST_EXTERNAL_SERVER=1: use a server already listening on PORT (e.g. one started under `node --cpu-prof`)
const server = process.env.INGEST_EXTERNAL_SERVER === "1" ? { url: `http://127.0.0.1:${port}`, stop: () => undefined } : await startServer(port);
const db = fixtureDb();
try {
  const results = [];
  const line = (x: Awaited<ReturnType<typeof round>>): string =>
    `${x.requests} requests in ${x.elapsed.toFixed(1)} s = ${x.batchesPerS.toFixed(0)} batches/s, p50 ${x.p50.toFixed(1)} ms, p99 ${x.p99.toFixed(1)} ms; stored ${x.created}, duplicates answered ${x.duplicates}, failed ${x.failed}; lost ${x.lost}, duplicated rows ${x.duplicatedRows}; CPU server ${x.serverCpu === null ? "?" : x.serverCpu.toFixed(1)} s (${x.serverCpu === null ? "?" : ((100 * x.serverCpu) / x.elapsed).toFixed(0)} % of a core), generator ${x.generatorCpu.toFixed(1)} s (${((100 * x.generatorCpu) / x.elapsed).toFixed(0)} %); load average ${x.load0.toFixed(2)} → ${x.load1.toFixed(2)}`;
  for (let r = 0; r < WARMUP_ROUNDS; r++) console.log(`warm-up round (not counted): ${line(await round(server.url, db, -1 - r, null))}`);
  const paced = [];
  for (let r = 0; r < ROUNDS; r++) {
    const x = await round(server.url, db, r, null);
    results.push(x);
    console.log(`capacity round ${r + 1} (closed loop): ${line(x)}`);
    const y = await round(server.url, db, 100 + r, RATE);
    paced.push(y);
    console.log(`paced round ${r + 1} (${RATE} batches/s offered; latency from when each batch was due): ${line(y)}`);
  }
  const all = [...results, ...paced];
  const lost = all.reduce((a, x) => a + x.lost, 0), duplicated = all.reduce((a, x) => a + x.duplicatedRows, 0), failed = all.reduce((a, x) => a + x.failed, 0);
  const pacedRate = median(paced.map((x) => x.batchesPerS)), pacedP99 = median(paced.map((x) => x.p99));
  console.log(`capacity, median of ${ROUNDS}: ${median(results.map((x) => x.batchesPerS)).toFixed(0)} batches/s, p50 ${median(results.map((x) => x.p50)).toFixed(1)} ms, p99 ${median(results.map((x) => x.p99)).toFixed(1)} ms (queueing at saturation)`);
  console.log(`paced at ${RATE}/s, median of ${ROUNDS}: ${pacedRate.toFixed(0)} batches/s, p50 ${median(paced.map((x) => x.p50)).toFixed(1)} ms, p99 ${pacedP99.toFixed(1)} ms (target ≥ 200/s at p99 < 250 ms); lost ${lost}, duplicated ${duplicated}, failed ${failed}`);
  if (!(pacedRate >= 200 && pacedP99 < 250 && lost === 0 && duplicated === 0 && failed === 0)) {
    console.error("target missed");
    process.exitCode = 1;
  }
} finally {
  await db.destroy();
  server.stop();
}
