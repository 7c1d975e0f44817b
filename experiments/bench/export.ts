// bench:export — a generated study of 100 participants with raw streams (about 1 M movements in
// trials.csv, one gzip replay stream per sequence) is written under /tmp as plain files; then, in
// the same run and alternating, (a) the archive writer exports it in a fresh process started as the
// server starts an export job (lib/data/exportProcess.ts: --max-old-space-size from
// exportHeapLimitMb of the movement count; trials read line by line from the file, streams one at a time), (b) `zip -r` zips the same files. Reports
// medians of wall time, MB/s over the input bytes, and peak RSS (GNU time), and checks the
// export's peak RSS against 300 MB.
// Scale with YAWPOINT_BENCH_PARTICIPANTS, YAWPOINT_BENCH_BLOCKS, YAWPOINT_BENCH_RUNS.
import { spawnSync } from "node:child_process";
import { createReadStream, existsSync, linkSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { readFile } from "node:fs/promises";
import { createInterface } from "node:readline";
import { gzipSync } from "node:zlib";
import { median } from "simple-statistics";
import { generateTrialRows } from "../generate";
import { writeTrialTable } from "../generate";
import { exportHeapLimitMb, writeArchive, type ArchiveSource, type ExportStream } from "../../lib/export";
import { formatSampleCsv } from "../../lib/motion/csv";
import { simulateSequence } from "../../lib/motion/simulate";
import type { TrialRecord } from "../../lib/results";
import { conditionsOf, studyDesignSchema } from "../../lib/study/design";
import { ringTargets, ringVisitingOrder } from "../../lib/task";

const dir = process.env.YAWPOINT_BENCH_DIR ?? "/tmp/yawpoint-bench-export";
const participants = Number(process.env.YAWPOINT_BENCH_PARTICIPANTS ?? 100);
const blocks = Number(process.env.YAWPOINT_BENCH_BLOCKS ?? 14); // 100 × 6 conditions × 9 A×W × 13 movements × 14 ≈ 0.98 M
const runs = Number(process.env.YAWPOINT_BENCH_RUNS ?? 3);
const gen = { participants, blocks, techniques: ["motion", "stick"], gains: [2, 4, 6], seed: 7 };
const design = studyDesignSchema.parse({
  factors: [
    { name: "technique", levels: [{ label: "motion", config: {} }, { label: "stick", config: {} }] },
    { name: "gain", levels: [{ label: "2", config: {} }, { label: "4", config: {} }, { label: "6", config: {} }] },
  ],
  task: { amplitudes: [128, 256, 512], widths: [16, 32, 64], targetsPerRing: 13 },
  blocks,
  counterbalancing: { method: "williams" },
  plannedParticipants: participants,
});
/** The generator's labels ("motion-2") are the condition labels of this design's crossing ("motion / 2"). */
const label = (generated: string): string => generated.replace("-", " / ");

async function prepare(): Promise<void> {
  const marker = `${dir}/.ready-${participants}-${blocks}`;
  if (existsSync(marker)) return;
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(`${dir}/data/streams`, { recursive: true });
  const movements = await writeTrialTable(`${dir}/data/trials-generated.csv`, gen);
  // A pool of real simulated streams (phone sensor, 60 Hz), hard-linked once per sequence.
  const pool: string[] = [];
  const ring = ringTargets(13, 256 / Math.cos(Math.PI / 26));
  const targets = ringVisitingOrder(13).map((i) => ring[i]!);
  for (let i = 0; i < 32; i++) {
    const sim = simulateSequence({ targets, amplitude: 256, width: 32 }, { displayMode: "cursor", gain: 2 + (i % 4), pixelsPerDegree: 10 }, { seed: i + 1, sensor: "phone", restMs: 300 });
    const path = `${dir}/pool-${i}.csv.gz`;
    writeFileSync(path, gzipSync(formatSampleCsv(sim.samples)));
    pool.push(path);
  }
  let k = 0;
  const seen = new Set<string>();
  for (const r of generateTrialRows(gen)) {
    const key = `${r.participant}/b${r.block}-${r.condition}-s${r.sequence}`;
    if (seen.has(key)) continue;
    seen.add(key);
    mkdirSync(`${dir}/data/streams/${r.participant}`, { recursive: true });
    linkSync(pool[k++ % pool.length]!, `${dir}/data/streams/${key}.csv.gz`);
  }
  writeFileSync(marker, JSON.stringify({ movements, streams: seen.size }));
}

/** A file-backed source: trials read line by line, streams one file at a time. */
function fileSource(): ArchiveSource {
  const info = JSON.parse(readFileSync(readdirSync(dir).filter((f) => f.startsWith(".ready")).map((f) => `${dir}/${f}`)[0]!, "utf8")) as { movements: number; streams: number };
  const conditionIndex = new Map(conditionsOf(design).map((c, i) => [c.label, i]));
  const ids = new Map(Array.from({ length: participants }, (_, i) => [`P${String(i + 1).padStart(2, "0")}`, i + 1]));
  return {
    study: { id: 1, title: "Export benchmark (generated)", design, createdAt: new Date(0) },
    consentVersions: [{ version: 1, sha256: null, status: "approved", bodyMd: "# Consent (benchmark)\n" }],
    participants: [...ids.values()].map((id) => ({ id, status: "completed", cbRow: id % 4, conditionOrder: [], betweenLevels: {}, startedAt: new Date(0), completedAt: new Date(1_500_000), final: { age_band: "25-34", handedness: "right", experience: 3 } })),
    counts: { trials: info.movements, streams: info.streams },
    async *trials(): AsyncIterable<TrialRecord> {
      const lines = createInterface({ input: createReadStream(`${dir}/data/trials-generated.csv`), crlfDelay: Infinity });
      let header = true;
      for await (const line of lines) {
        if (header || line === "") {
          header = false;
          continue;
        }
        const f = line.split(",");
        yield {
          participant_id: ids.get(f[0]!)!, condition: label(f[1]!), block: Number(f[2]), sequence: Number(f[3]), trial: Number(f[4]), amplitude: Number(f[5]), width: Number(f[6]),
          from_x: Number(f[7]), from_y: Number(f[8]), to_x: Number(f[9]), to_y: Number(f[10]), start_x: Number(f[11]), start_y: Number(f[12]), end_x: Number(f[13]), end_y: Number(f[14]), time_ms: Number(f[15]), hit: Number(f[16]), timed_out: 0, recentered: 0, clutched: 0,
        };
      }
    },
    async *answers() {},
    async *streams(): AsyncIterable<ExportStream> {
      for (const p of readdirSync(`${dir}/data/streams`).sort()) {
        for (const f of readdirSync(`${dir}/data/streams/${p}`).sort()) {
          const m = f.match(/^b(\d+)-(.+)-s(\d+)\.csv\.gz$/)!;
          const path = `${dir}/data/streams/${p}/${f}`;
          yield { participantId: ids.get(p)!, condition: label(m[2]!), conditionIndex: conditionIndex.get(label(m[2]!)) ?? 0, block: Number(m[1]), sequence: Number(m[3]), practice: false, read: () => readFile(path) };
        }
      }
    },
  };
}

function inputBytes(path: string): number {
  const st = statSync(path);
  if (!st.isDirectory()) return st.size;
  return readdirSync(path).reduce((n, f) => n + inputBytes(`${path}/${f}`), 0);
}

if (process.argv[2] === "--child") {
  if (process.env.YAWPOINT_BENCH_VERBOSE) process.stderr.write(`RSS at start: ${(process.memoryUsage.rss() / 1e6).toFixed(0)} MB\n`);
  const out = process.argv[3]!;
  const t0 = performance.now();
  const pseudonyms = new Map(Array.from({ length: participants }, (_, i) => [i + 1, `r-${String(i + 1).padStart(3, "0")}`]));
  const peaks = new Map<string, NodeJS.MemoryUsage>();
  let current = "start";
  const sample = (): void => {
    const m = process.memoryUsage();
    if (m.rss > (peaks.get(current)?.rss ?? 0)) peaks.set(current, m);
  };
  const sampler = setInterval(sample, 50); // between progress calls too (the central directory is written after the last one)
  const s = await writeArchive(fileSource(), { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: false }, pseudonyms, out, (_f, stage) => {
    sample();
    current = stage;
    sample();
  });
  clearInterval(sampler);
  const mb = (n: number): string => (n / 1e6).toFixed(0);
  if (process.env.YAWPOINT_BENCH_VERBOSE) process.stderr.write(`peak RSS by stage (MB; heap used/total, external, array buffers at that moment): ${[...peaks].map(([k, m]) => `${k} ${mb(m.rss)} (${mb(m.heapUsed)}/${mb(m.heapTotal)}, ${mb(m.external)}, ${mb(m.arrayBuffers)})`).join("; ")}\n`);
  process.stdout.write(JSON.stringify({ seconds: (performance.now() - t0) / 1000, bytes: s.sizeBytes, movements: s.movements, streams: s.streams }) + "\n");
} else {
  await prepare();
  const input = inputBytes(`${dir}/data`);
  const info = readFileSync(readdirSync(dir).filter((f) => f.startsWith(".ready")).map((f) => `${dir}/${f}`)[0]!, "utf8");
  console.log(`input: ${(input / 1e6).toFixed(1)} MB in ${dir}/data (${info})`);
  const ours: { s: number; rss: number; out: number }[] = [];
  const zips: { s: number; rss: number; out: number }[] = [];
  const heapMb = exportHeapLimitMb((JSON.parse(info) as { movements: number }).movements);
  for (let i = 0; i < runs; i++) {
    rmSync(`${dir}/ours.zip`, { force: true });
    const a = spawnSync("/usr/bin/time", ["-f", "%e %M", process.execPath, `--max-old-space-size=${heapMb}`, "--import", "tsx", "--no-warnings", "experiments/bench/export.ts", "--child", `${dir}/ours.zip`], { encoding: "utf8", maxBuffer: 1 << 26 });
    if (a.status !== 0) throw new Error(`export failed: ${a.stderr}`);
    const lines = a.stderr.trim().split("\n");
    for (const l of lines.slice(0, -1)) console.log(`  child: ${l}`);
    const [sa, ka] = lines.at(-1)!.split(" ").map(Number);
    ours.push({ s: sa!, rss: ka! / 1024, out: statSync(`${dir}/ours.zip`).size });
    rmSync(`${dir}/zip.zip`, { force: true });
    const z = spawnSync("/usr/bin/time", ["-f", "%e %M", "zip", "-q", "-r", `${dir}/zip.zip`, "."], { cwd: `${dir}/data`, encoding: "utf8" });
    if (z.status !== 0) throw new Error(`zip failed: ${z.stderr}`);
    const [sz, kz] = z.stderr.trim().split("\n").at(-1)!.split(" ").map(Number);
    zips.push({ s: sz!, rss: kz! / 1024, out: statSync(`${dir}/zip.zip`).size });
    console.log(`run ${i + 1}: export (heap cap ${heapMb} MB) ${sa!.toFixed(1)} s, ${(ka! / 1024).toFixed(0)} MB RSS; zip -r ${sz!.toFixed(1)} s, ${(kz! / 1024).toFixed(0)} MB RSS`);
  }
  const mo = median(ours.map((r) => r.s)), mz = median(zips.map((r) => r.s));
  const peak = Math.max(...ours.map((r) => r.rss));
  console.log(`\nmedian of ${runs} runs, same input (${(input / 1e6).toFixed(1)} MB), load average ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}:`);
  console.log(`  export (archiver, streamed): ${mo.toFixed(1)} s = ${(input / 1e6 / mo).toFixed(1)} MB/s, peak RSS ${peak.toFixed(0)} MB (limit 300), archive ${(median(ours.map((r) => r.out)) / 1e6).toFixed(1)} MB`);
  console.log(`  zip -r:                      ${mz.toFixed(1)} s = ${(input / 1e6 / mz).toFixed(1)} MB/s, peak RSS ${median(zips.map((r) => r.rss)).toFixed(0)} MB, archive ${(median(zips.map((r) => r.out)) / 1e6).toFixed(1)} MB`);
  console.log(`  ratio export/zip time: ${(mo / mz).toFixed(2)} (the export also runs the ISO analysis over every movement)`);
  if (peak > 300) {
    console.error(`peak RSS ${peak.toFixed(0)} MB is over 300 MB`);
    process.exitCode = 1;
  }
}
