// bench:analysis — generates simulated trial tables (10 k, 100 k, 1 M movements; 20 participants ×
// 8 conditions × 9 A×W × sequences of 13) under /tmp, then times `analyze --json` on each in a
// fresh process several times, started as `npm run analyze` starts it (experiments/cli/run.mjs),
// and reports medians of wall time, CPU time (user + sys) and peak RSS (GNU time). Then, in this
// process and back to back on the 1 M table, the reader with and without the plain-CSV fast path
// and with 1 and 2 worker threads, so the ratios come from the same moment of machine load.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, statSync } from "node:fs";
import { median } from "simple-statistics";
import { analyzeTrialFile } from "../../lib/analysis";
import { writeTrialTable } from "../generate";

const dir = process.env.YAWPOINT_BENCH_DIR ?? "/tmp/yawpoint-bench";
const runs = Number(process.env.YAWPOINT_BENCH_RUNS ?? 5);
const sizes = [10_000, 100_000, 1_000_000];
mkdirSync(dir, { recursive: true });

const rows: { movements: number; mb: number; seconds: number; cpu: number; rssMb: number; usPerMovement: number }[] = [];
for (const size of sizes) {
  const path = `${dir}/trials-${size}.csv`;
  if (!existsSync(path)) await writeTrialTable(path, { blocks: 100, maxMovements: size, seed: 42 });
  const times: number[] = [];
  const rss: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const r = spawnSync("/usr/bin/time", ["-f", "%e %M %U %S", process.execPath, "--no-warnings", "experiments/cli/run.mjs", "analyze", path, "--json"], {
      encoding: "utf8",
      maxBuffer: 1 << 30,
    });
    if (r.status !== 0) throw new Error(`analyze failed on ${path}: ${r.stderr}`);
    const [sec, kb, user, sys] = r.stderr.trim().split("\n").at(-1)!.split(" ").map(Number);
    times.push(sec!);
    rss.push(kb! / 1024);
    cpu.push(user! + sys!);
  }
  const seconds = median(times);
  rows.push({ movements: size, mb: statSync(path).size / 1e6, seconds, cpu: median(cpu), rssMb: median(rss), usPerMovement: (seconds / size) * 1e6 });
  console.log(`${size} movements: runs ${times.map((t) => t.toFixed(2)).join(", ")} s (CPU ${cpu.map((t) => t.toFixed(2)).join(", ")} s)`);
}
console.log(`\nanalyze --json, median of ${runs} runs each (wall time includes start-up); load average ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}`);
console.log("movements   file MB   median s   CPU s   peak RSS MB   µs/movement");
for (const r of rows) {
  console.log(`${String(r.movements).padStart(9)}  ${r.mb.toFixed(1).padStart(8)}  ${r.seconds.toFixed(2).padStart(9)}  ${r.cpu.toFixed(2).padStart(6)}  ${r.rssMb.toFixed(0).padStart(12)}  ${r.usPerMovement.toFixed(2).padStart(12)}`);
}
const [a, b, c] = rows;
console.log(`time ratios: 100k/10k = ${(b!.seconds / a!.seconds).toFixed(2)}, 1M/100k = ${(c!.seconds / b!.seconds).toFixed(2)} (10 for linear growth, less while start-up dominates)`);
console.log(`budget: 1 M movements ≤ 3 s: ${c!.seconds <= 3 ? "met" : "NOT met"}; peak RSS ≤ 500 MB: ${c!.rssMb <= 500 ? "met" : "NOT met"}`);

// In-process comparison on the 1 M table, interleaved: fast path vs csv-parse only; 1 vs 2 threads.
const big = `${dir}/trials-1000000.csv`;
const variants: { name: string; options: Parameters<typeof analyzeTrialFile>[1] }[] = [
  { name: "fast path, 1 thread", options: { threads: 1 } },
  { name: "csv-parse only, 1 thread", options: { threads: 1, parser: "csv-parse" } },
  { name: "fast path, 2 worker threads", options: { threads: 2 } },
];
const ms = new Map<string, number[]>(variants.map((v) => [v.name, []]));
const outputs = new Map<string, string>();
for (let i = 0; i < runs; i++) {
  for (const v of variants) {
    const t = performance.now();
    const result = await analyzeTrialFile(big, { file: big, ...v.options });
    ms.get(v.name)!.push(performance.now() - t);
    outputs.set(v.name, JSON.stringify(result));
  }
}
console.log(`\nin process, 1 M movements, median of ${runs} interleaved runs (load average ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}):`);
const base = median(ms.get(variants[0]!.name)!);
for (const v of variants) {
  const m = median(ms.get(v.name)!);
  console.log(`  ${v.name.padEnd(28)} ${(m / 1000).toFixed(2)} s (×${(m / base).toFixed(2)}); same JSON as the first: ${outputs.get(v.name) === outputs.get(variants[0]!.name)}`);
}

// Against a vectorised numpy script (experiments/bench/analysis_numpy.py, the same per-sequence
// measures and cells) on the 1 M table: the two commands alternate in one run, so both see the same
// machine load; each in a fresh process under GNU time (wall, CPU = user + sys, peak RSS). The
// script runs without --json when timed (its JSON writer is a Python loop: timing it would favour
// us); one extra run with --json checks that both give the same sequences and cells.
const python = process.env.YAWPOINT_PYTHON ?? "python3";
const numpyScript = "experiments/bench/analysis_numpy.py";
const probe = spawnSync(python, ["-c", "import numpy; print(numpy.__version__)"], { encoding: "utf8" });
if (probe.status !== 0) {
  console.log(`\nnumpy comparison skipped: ${python} cannot import numpy (${probe.stderr.trim().split("\n").at(-1)})`);
} else {
  type Timed = { wall: number; cpu: number; rssMb: number };
  const timed = (command: string, args: string[]): { t: Timed; stdout: string } => {
    const r = spawnSync("/usr/bin/time", ["-f", "%e %M %U %S", command, ...args], { encoding: "utf8", maxBuffer: 1 << 30 });
    if (r.status !== 0) throw new Error(`${command} ${args.join(" ")} failed: ${r.stderr}`);
    const [wall, kb, user, sys] = r.stderr.trim().split("\n").at(-1)!.split(" ").map(Number);
    return { t: { wall: wall!, cpu: user! + sys!, rssMb: kb! / 1024 }, stdout: r.stdout };
  };
  const cliArgs = ["--no-warnings", "experiments/cli/run.mjs", "analyze", big, "--json"];
  const ours: Timed[] = [];
  const theirs: Timed[] = [];
  let cliJson = "";
  for (let i = 0; i < runs; i++) {
    const a = timed(process.execPath, cliArgs);
    ours.push(a.t);
    cliJson = a.stdout;
    theirs.push(timed(python, [numpyScript, big]).t);
  }
  const outFile = `${dir}/numpy-output.json`;
  timed(python, [numpyScript, big, "--json", outFile]);
  const cli = JSON.parse(cliJson) as { excluded: number; sequences: Record<string, unknown>[]; cells: Record<string, unknown>[] };
  const ref = JSON.parse(readFileSync(outFile, "utf8")) as typeof cli;
  /** Largest relative difference over the keys the script writes; Infinity when the rows do not line up. */
  const worst = (xs: Record<string, unknown>[], ys: Record<string, unknown>[]): number => {
    if (xs.length !== ys.length) return Number.POSITIVE_INFINITY;
    let w = 0;
    const key = (r: Record<string, unknown>) => `${String(r.participant)}|${String(r.condition)}|${String(r.block ?? "")}|${String(r.sequence ?? "")}`;
    const byKey = new Map(xs.map((r) => [key(r), r]));
    for (const y of ys) {
      const x = byKey.get(key(y));
      if (x === undefined) return Number.POSITIVE_INFINITY;
      for (const [k, v] of Object.entries(y)) {
        if (typeof v !== "number") continue;
        const u = x[k];
        if (typeof u !== "number") return Number.POSITIVE_INFINITY;
        w = Math.max(w, Math.abs(u - v) / Math.max(1, Math.abs(v)));
      }
    }
    return w;
  };
  const med = (xs: Timed[], k: keyof Timed) => median(xs.map((x) => x[k]));
  const line = (name: string, xs: Timed[]) =>
    `  ${name.padEnd(34)} wall ${med(xs, "wall").toFixed(2).padStart(6)} s (runs ${xs.map((x) => x.wall.toFixed(2)).join(", ")})  CPU ${med(xs, "cpu").toFixed(2).padStart(6)} s  peak RSS ${med(xs, "rssMb").toFixed(0).padStart(4)} MB`;
  console.log(`\nagainst numpy ${probe.stdout.trim()} (${python}), 1 M movements, ${runs} alternating runs each, medians (load average ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}):`);
  console.log(line("npm run analyze -- FILE --json", ours));
  console.log(line("analysis_numpy.py FILE", theirs));
  const wallRatio = med(ours, "wall") / med(theirs, "wall");
  const cpuRatio = med(ours, "cpu") / med(theirs, "cpu");
  console.log(`  ratio analyze / numpy: wall ${wallRatio.toFixed(2)}×, CPU ${cpuRatio.toFixed(2)}× (target ≤ 0.4× wall: ${wallRatio <= 0.4 ? "met" : "NOT met"}); analyze's peak RSS ≤ 300 MB: ${med(ours, "rssMb") <= 300 ? "met" : "NOT met"}`);
  console.log(
    `  same output: misfires ${cli.excluded} vs ${ref.excluded}; sequences ${cli.sequences.length} vs ${ref.sequences.length} (largest relative difference ${worst(cli.sequences, ref.sequences).toExponential(1)}); cells ${cli.cells.length} vs ${ref.cells.length} (${worst(cli.cells, ref.cells).toExponential(1)})`,
  );
}
