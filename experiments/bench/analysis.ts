// bench:analysis — generates simulated trial tables (10 k, 100 k, 1 M movements; 20 participants ×
// 8 conditions × 9 A×W × sequences of 13) under /tmp, then times `analyze --json` on each in a
// fresh process several times and reports medians of wall time and peak RSS (GNU time).
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, statSync } from "node:fs";
import { median } from "simple-statistics";
import { writeTrialTable } from "../generate";

const dir = process.env.YAWPOINT_BENCH_DIR ?? "/tmp/yawpoint-bench";
const runs = Number(process.env.YAWPOINT_BENCH_RUNS ?? 5);
const sizes = [10_000, 100_000, 1_000_000];
mkdirSync(dir, { recursive: true });

const rows: { movements: number; mb: number; seconds: number; rssMb: number; usPerMovement: number }[] = [];
for (const size of sizes) {
  const path = `${dir}/trials-${size}.csv`;
  if (!existsSync(path)) await writeTrialTable(path, { blocks: 100, maxMovements: size, seed: 42 });
  const times: number[] = [];
  const rss: number[] = [];
  for (let i = 0; i < runs; i++) {
    const r = spawnSync("/usr/bin/time", ["-f", "%e %M", "node_modules/.bin/tsx", "--no-warnings", "experiments/cli/analyze.ts", path, "--json"], {
      encoding: "utf8",
      maxBuffer: 1 << 30,
    });
    if (r.status !== 0) throw new Error(`analyze failed on ${path}: ${r.stderr}`);
    const [sec, kb] = r.stderr.trim().split("\n").at(-1)!.split(" ").map(Number);
    times.push(sec!);
    rss.push(kb! / 1024);
  }
  const seconds = median(times);
  rows.push({ movements: size, mb: statSync(path).size / 1e6, seconds, rssMb: median(rss), usPerMovement: (seconds / size) * 1e6 });
  console.log(`${size} movements: runs ${times.map((t) => t.toFixed(2)).join(", ")} s`);
}
console.log(`\nanalyze --json, median of ${runs} runs each (wall time includes tsx start-up)`);
console.log("movements   file MB   median s   peak RSS MB   µs/movement");
for (const r of rows) {
  console.log(`${String(r.movements).padStart(9)}  ${r.mb.toFixed(1).padStart(8)}  ${r.seconds.toFixed(2).padStart(9)}  ${r.rssMb.toFixed(0).padStart(12)}  ${r.usPerMovement.toFixed(2).padStart(12)}`);
}
const [a, b, c] = rows;
console.log(`time ratios: 100k/10k = ${(b!.seconds / a!.seconds).toFixed(2)}, 1M/100k = ${(c!.seconds / b!.seconds).toFixed(2)} (10 for linear growth, less while start-up dominates)`);
console.log(`budget: 1 M movements ≤ 3 s: ${c!.seconds <= 3 ? "met" : "NOT met"}; peak RSS ≤ 500 MB: ${c!.rssMb <= 500 ? "met" : "NOT met"}`);
