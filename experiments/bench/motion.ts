// npm run bench:motion — motion engine throughput and replay speed.
// 1. The engine as it ships: lib/motion/engine.ts bundled with esbuild (scope-hoisted, as the
//    replay CLI and the participant page run it; through tsx every cross-module call would go
//    through an export getter). Each configuration of `configurations` once, to find the most
//    expensive; then 10 M samples × BENCH_RUNS through it. Before timing, each engine is warmed
//    up on the same varied input the timed loop uses (an engine warmed on zeros meets its first
//    stick at the rim, slow rotation, clutch… in the timed loop, leaves optimised code there and
//    allocates while it recompiles). Reported per run: ns per sample twice (wall clock, and this
//    process's CPU time, user + system, which on a shared, loaded machine leaves out the time
//    the process waited for a core); heap used before and right after the timed loop (no GC in
//    between: what the loop left in the young generation, per sample) and after a forced GC
//    (growth); the garbage collections during the loop by kind (PerformanceObserver 'gc'
//    entries): minor (scavenge) collections are what allocation on the hot path causes; major
//    ones can also come from V8's idle-time memory reducer while the loop yields between chunks.
// 2. Replay of a 1 M-sample CSV end to end, started as `npm run replay` starts it
//    (`node experiments/cli/run.mjs replay`, a fresh process each run, output to /dev/null): wall
//    time, median of several runs; also the in-process parts (reader, engine and writer bundled
//    as the CLI bundles them) and the start-up alone.
import { spawnSync } from "node:child_process";
import { mkdtempSync, openSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { constants as perfConstants, PerformanceObserver } from "node:perf_hooks";
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";
import { build } from "esbuild";
import type { TransferConfigInput } from "../../lib/motion/config";
import type { MotionSample } from "../../lib/motion/sample";

setFlagsFromString("--expose-gc");
const gc = runInNewContext("gc") as () => void;

const bundle = join("node_modules", ".cache", "yawpoint-bench", "motion-engine.mjs");
await build({ entryPoints: ["lib/motion/engine.ts"], outfile: bundle, bundle: true, platform: "node", format: "esm", target: "node20", packages: "external", logLevel: "error" });
const { createMotionEngine } = (await import(pathToFileURL(join(process.cwd(), bundle)).href)) as typeof import("../../lib/motion/engine");
// the replay CLI's reader and writer, bundled the same way for the in-process parts of the replay
const partsBundle = join("node_modules", ".cache", "yawpoint-bench", "replay-parts.mjs");
await build({
  stdin: { contents: 'export { parseSampleCsv, sampleFromTable } from "./lib/motion/csv";\nexport { writeMillionths, writeNumberText } from "./experiments/cli/writeMillionths";\n', resolveDir: process.cwd(), loader: "ts" },
  outfile: partsBundle, bundle: true, platform: "node", format: "esm", target: "node20", packages: "external", logLevel: "error",
});
const { parseSampleCsv, sampleFromTable, writeMillionths, writeNumberText } = (await import(pathToFileURL(join(process.cwd(), partsBundle)).href)) as typeof import("../../lib/motion/csv") & typeof import("../cli/writeMillionths");

/** Every stage each channel can run, at its most expensive setting; the slowest is timed at length. */
const heavy: TransferConfigInput = {
  frame: "gravity", gravityFilterTimeMs: 400, gainCurve: "power", curveExponent: 1.6,
  gain: 4, deadBandDegPerS: 0.5, smoothingTimeMs: 30, smoothingSpeedDegPerS: 10, addedLatencyMs: 50,
  displayMode: "cursor", pixelsPerDegree: 12, horizontalGainMultiplier: 1.2, verticalGainMultiplier: 0.8, invertVertical: true,
};
const configurations: Record<string, TransferConfigInput> = {
  "motion+stick (rate), gravity frame": { ...heavy, technique: "motion+stick" },
  "motion+stick (heading), gravity frame": { ...heavy, technique: "motion+stick", stickMode: "heading" },
  "motion, adaptive frame, two-level curve": { ...heavy, technique: "motion", frame: "adaptive", gainCurve: "two-level" },
  "motion+touch, gravity frame": { ...heavy, technique: "motion+touch" },
  "tilt-rate": { ...heavy, technique: "tilt-rate", tiltExponent: 1.5 },
  "touch (absolute, cursor)": { ...heavy, technique: "touch" },
};
const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
};

// a pool of varied input values (precomputed, so the loop measures the engine, not Math.sin)
const POOL = 4096;
const pool = { gx: new Float64Array(POOL), gy: new Float64Array(POOL), gz: new Float64Array(POOL), ax: new Float64Array(POOL), ay: new Float64Array(POOL), az: new Float64Array(POOL), sx: new Float64Array(POOL), sy: new Float64Array(POOL) };
for (let i = 0; i < POOL; i++) {
  pool.gx[i] = 40 * Math.sin(i / 37);
  pool.gy[i] = 60 * Math.cos(i / 53);
  pool.gz[i] = 5 * Math.sin(i / 11);
  const p = 0.3 * Math.sin(i / 200);
  pool.ax[i] = 0.2 * Math.sin(i / 7);
  pool.ay[i] = 9.8 * Math.cos(p);
  pool.az[i] = 9.8 * Math.sin(p);
  pool.sx[i] = Math.sin(i / 90);
  pool.sy[i] = 0.5 * Math.cos(i / 70);
}

const CHUNK = 500_000;
const WARM_UP = 300_000;

/** Samples start..end through the engine, timed (a plain function: nothing here lives across an await). */
function timedChunk(engine: ReturnType<typeof createMotionEngine>, s: MotionSample, start: number, end: number, sum: { checksum: number; cpuUs: number }): bigint {
  const c0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  for (let i = start; i < end; i++) {
    const k = (i + WARM_UP) & (POOL - 1);
    s.tMs = 4_000_000 + i * 4;
    s.gyroX = pool.gx[k] as number;
    s.gyroY = pool.gy[k] as number;
    s.gyroZ = pool.gz[k] as number;
    s.accelX = pool.ax[k];
    s.accelY = pool.ay[k];
    s.accelZ = pool.az[k];
    s.stickX = pool.sx[k];
    s.stickY = pool.sy[k];
    s.pointerDx = pool.sy[k];
    s.pointerDy = pool.sx[k];
    s.pointerX = pool.gx[k];
    s.pointerY = pool.gy[k];
    const o = engine.push(s);
    if (o !== null) sum.checksum += o.dx;
  }
  const wall = process.hrtime.bigint() - t0;
  const c = process.cpuUsage(c0);
  sum.cpuUs += c.user + c.system;
  return wall;
}
/**
 * n samples through the engine in chunks of CHUNK; the event loop turns between chunks (outside
 * the timed part) so that garbage-collection entries reach the observer: a loop that never yields
 * would see none.
 */
async function engineRun(config: TransferConfigInput, n: number): Promise<{ nsPerSample: number; cpuNsPerSample: number; heapBefore: number; heapAfter: number; bytesPerSample: number; minorGcs: number; majorGcs: number; checksum: number }> {
  const engine = createMotionEngine(config);
  const s: MotionSample = { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0, accelX: 0, accelY: 9.8, accelZ: 0, stickX: 0, stickY: 0, buttons: 0, pointerDx: 0, pointerDy: 0, pointerX: 0, pointerY: 0, screenAngleDeg: 90 };
  const sum = { checksum: 0, cpuUs: 0 };
  // warm-up on the timed loop's own input (times before the timed part's, which starts at i = 0)
  timedChunk(engine, s, -WARM_UP, 0, sum);
  sum.cpuUs = 0;
  gc();
  const heapBefore = process.memoryUsage().heapUsed;
  let minorGcs = 0, majorGcs = 0;
  const obs = new PerformanceObserver((list) => {
    for (const e of list.getEntries()) {
      if ((e as PerformanceEntry & { detail?: { kind?: number } }).detail?.kind === perfConstants.NODE_PERFORMANCE_GC_MINOR) minorGcs++;
      else majorGcs++;
    }
  });
  obs.observe({ entryTypes: ["gc"] });
  let elapsed = 0n, heapLeft = 0;
  for (let start = 0; start < n; start += CHUNK) {
    const before = process.memoryUsage().heapUsed;
    elapsed += timedChunk(engine, s, start, Math.min(n, start + CHUNK), sum);
    heapLeft += process.memoryUsage().heapUsed - before;
    await new Promise((resolve) => setImmediate(resolve));
  }
  await new Promise((resolve) => setTimeout(resolve, 20));
  obs.disconnect();
  gc();
  return { nsPerSample: Number(elapsed) / n, cpuNsPerSample: (sum.cpuUs * 1000) / n, heapBefore, heapAfter: process.memoryUsage().heapUsed, bytesPerSample: heapLeft / n, minorGcs, majorGcs, checksum: sum.checksum };
}

function writeCsv(path: string, rows: number): void {
  const fd = openSync(path, "w");
  let chunk = "t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle\n";
  for (let i = 0; i < rows; i++) {
    const k = i & (POOL - 1);
    chunk += `${i * 4},${(pool.gx[k] as number).toFixed(2)},${(pool.gy[k] as number).toFixed(2)},${(pool.gz[k] as number).toFixed(2)},${(pool.ax[k] as number).toFixed(3)},${(pool.ay[k] as number).toFixed(3)},${(pool.az[k] as number).toFixed(3)},${(pool.sx[k] as number).toFixed(3)},${(pool.sy[k] as number).toFixed(3)},0,90\n`;
    if (chunk.length > 1 << 16) {
      writeFileSync(fd, chunk);
      chunk = "";
    }
  }
  writeFileSync(fd, chunk);
}

const runs = Number(process.env.BENCH_RUNS ?? 5);
const N = 10_000_000;
console.log(`motion engine (bundled), each configuration once, 2,000,000 samples:`);
let expensiveName = "", slowest = 0;
for (const [name, config] of Object.entries(configurations)) {
  const r = await engineRun(config, 2_000_000);
  console.log(`  ${name}: ${r.nsPerSample.toFixed(1)} ns/sample wall, ${r.cpuNsPerSample.toFixed(1)} CPU; GCs minor ${r.minorGcs}, major ${r.majorGcs}`);
  if (r.cpuNsPerSample > slowest) {
    slowest = r.cpuNsPerSample;
    expensiveName = name;
  }
}
const expensive = configurations[expensiveName] as TransferConfigInput;
console.log(`most expensive: ${expensiveName}; ${N.toLocaleString("en")} samples × ${runs} runs`);
const results = [];
for (let r = 0; r < runs; r++) {
  const res = await engineRun(expensive, N);
  results.push(res);
  console.log(`  run ${r + 1}: ${res.nsPerSample.toFixed(1)} ns/sample wall, ${res.cpuNsPerSample.toFixed(1)} CPU; heap used ${(res.heapBefore / 1e6).toFixed(2)} MB before → ${(res.heapAfter / 1e6).toFixed(2)} MB after (both after a full GC), left by the loop ${res.bytesPerSample.toFixed(3)} B/sample; GCs during the run: minor ${res.minorGcs}, major ${res.majorGcs}`);
}
const medNs = median(results.map((r) => r.nsPerSample)), medCpuNs = median(results.map((r) => r.cpuNsPerSample));
console.log(`  median ${medNs.toFixed(1)} ns/sample wall (budget 1000 ns: ratio ${(medNs / 1000).toFixed(3)}), ${medCpuNs.toFixed(1)} ns/sample CPU (ratio ${(medCpuNs / 1000).toFixed(3)}); median heap growth ${(median(results.map((r) => r.heapAfter - r.heapBefore)) / 1e3).toFixed(1)} kB; median GCs minor ${median(results.map((r) => r.minorGcs))}, major ${median(results.map((r) => r.majorGcs))}; load average ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}`);

const dir = mkdtempSync(join(tmpdir(), "bench-motion-"));
const csv = join(dir, "samples.csv"), cfg = join(dir, "config.json");
writeCsv(csv, 1_000_000);
writeFileSync(cfg, JSON.stringify(expensive));

// in-process parts of the replay
const phases: { read: number[]; parse: number[]; engine: number[]; format: number[] } = { read: [], parse: [], engine: [], format: [] };
for (let r = 0; r < 3; r++) {
  let t = performance.now();
  const text = readFileSync(csv, "utf8");
  phases.read.push(performance.now() - t);
  t = performance.now();
  const table = parseSampleCsv(text, csv);
  phases.parse.push(performance.now() - t);
  t = performance.now();
  const e = createMotionEngine(expensive);
  const s: MotionSample = { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 };
  const xs = new Float64Array(table.length), ys = new Float64Array(table.length);
  let x = 0, y = 0;
  for (let i = 0; i < table.length; i++) {
    const o = e.push(sampleFromTable(table, i, s));
    if (o) {
      x += o.dx;
      y += o.dy;
    }
    xs[i] = x;
    ys[i] = y;
  }
  phases.engine.push(performance.now() - t);
  // output lines as the replay CLI writes them (bytes into one 1 MB buffer, flushed when nearly full; not written here)
  t = performance.now();
  const out = Buffer.allocUnsafe(1 << 20);
  let at = 0, bytes = 0;
  for (let i = 0; i < table.length; i++) {
    at = writeNumberText(out, at, table.columns.t_ms[i] as number);
    out[at++] = 44;
    at = writeMillionths(out, at, xs[i] as number);
    out[at++] = 44;
    at = writeMillionths(out, at, ys[i] as number);
    out[at++] = 10;
    if (at > out.length - 256) {
      bytes += at;
      at = 0;
    }
  }
  bytes += at;
  phases.format.push(performance.now() - t);
  if (bytes === 0) console.log("(no output)");
}
console.log(`replay parts, 1 M rows (median of 3): read ${median(phases.read).toFixed(0)} ms, parse ${median(phases.parse).toFixed(0)} ms, engine ${median(phases.engine).toFixed(0)} ms, output formatting ${median(phases.format).toFixed(0)} ms`);

const walls: number[] = [];
const replay = (samples: string) => spawnSync(process.execPath, ["--no-warnings", "experiments/cli/run.mjs", "replay", "--config", cfg, samples], { stdio: ["ignore", "ignore", "pipe"] });
const tiny = join(dir, "one.csv");
writeFileSync(tiny, "t_ms,gyro_x,gyro_y,gyro_z\n0,0,0,0\n");
replay(tiny); // builds the bundle if a source changed
for (let r = 0; r < runs; r++) {
  const t = performance.now();
  const out = replay(csv);
  walls.push(performance.now() - t);
  if (out.status !== 0) throw new Error(`replay failed: ${String(out.stderr)}`);
}
const startup: number[] = [];
for (let r = 0; r < 3; r++) {
  const t = performance.now();
  replay(tiny);
  startup.push(performance.now() - t);
}
const medWall = median(walls);
const load = readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ");
console.log(`replay end to end, 1 M rows, fresh process per run: ${walls.map((w) => w.toFixed(0)).join(", ")} ms; median ${medWall.toFixed(0)} ms (budget 2000 ms: ratio ${(medWall / 2000).toFixed(2)}); of which start-up (a 1-row replay) ≈ ${median(startup).toFixed(0)} ms; load average ${load}`);
