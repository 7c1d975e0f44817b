import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { promisify } from "node:util";
import { execFile } from "node:child_process";
import { formatSampleCsv } from "./csvFormat";
import type { TransferConfigInput } from "./config";
import { simulateSequence } from "./simulate/participant";
import { ringAmplitude, ringTargets, ringVisitingOrder } from "../task";

// The replay CLI as interfaces.md fixes it: `replay --config FILE.json SAMPLES.csv` → t_ms,yaw_deg,pitch_deg
// (view) or t_ms,x_px,y_px (cursor); bad input → exit 2, one line naming file, line and column.
const dir = mkdtempSync(join(tmpdir(), "replay-"));
// through the launcher `npm run replay` uses (a bundle of experiments/cli/replay.ts, rebuilt when a source changes)
const run = (args: string[]) => spawnSync(process.execPath, ["--no-warnings", "experiments/cli/run.mjs", "replay", ...args], { encoding: "utf8", cwd: process.cwd() });
const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};
const samples = file("s.csv", "t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle\n0,0,0,0,,,,,,,0\n100,10,30,0,,,,,,0,0\n200,0,30,0,,,,,,1,\n");

describe("replay CLI", { timeout: 30_000 }, () => {
  it("prints the accumulated view angles (gain 6: 30 deg/s for 0.1 s is 18° of view; the clutch stops it)", () => {
    const r = run(["--config", file("v.json", '{ "gain": 6 }'), samples]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe("t_ms,yaw_deg,pitch_deg\n0,0,0\n100,-18,-6\n200,-18,-6\n");
  });
  it("prints cursor pixels in cursor mode", () => {
    const r = run(["--config", file("c.json", '{ "displayMode": "cursor", "pixelsPerDegree": 10 }'), samples]);
    expect(r.stdout.split("\n")[0]).toBe("t_ms,x_px,y_px");
    expect(r.stdout.split("\n")[2]).toBe("100,-30,10");
  });
  it("--start sets where the output starts; a finger's position (touch in cursor mode) puts the cursor there", () => {
    const touch = file("t.csv", "t_ms,gyro_x,gyro_y,gyro_z,pointer_dx,pointer_dy,pointer_x,pointer_y,selected\n0,0,0,0,,,,,0\n10,0,0,0,,,150,90,1\n20,0,0,0,,,160,95,0\n30,0,0,0,4,,,,1\n");
    const r = run(["--config", file("tc.json", '{ "technique": "touch", "displayMode": "cursor" }'), "--start", "100,50", touch]);
    expect(r.status).toBe(0);
    // direct touch: the cursor is where the finger is (the later drag delta of 4 px moves it on)
    expect(r.stdout).toBe("t_ms,x_px,y_px\n0,100,50\n10,150,90\n20,160,95\n30,164,95\n");
    const view = run(["--config", file("sv.json", '{ "gain": 6 }'), "--start=10,-2", samples]);
    expect(view.stdout.split("\n")[2]).toBe("100,-8,-8");
    expect(run(["--config", file("sv2.json", "{}"), "--start", "1", samples]).status).toBe(2);
    // --bounds keeps the cursor in the task area, as the runner does: 30 deg/s for 0.1 s at 10 px/deg would reach x = -30
    const kept = run(["--config", file("cb.json", '{ "displayMode": "cursor", "pixelsPerDegree": 10 }'), "--start", "10,10", "--bounds", "500,300", samples]);
    expect(kept.stdout.split("\n")[2]).toBe("100,0,20");
  });
  it("bad sample → exit 2, one line naming file, line and column, nothing on stdout", () => {
    const bad = file("b.csv", "t_ms,gyro_x,gyro_y,gyro_z\n0,0,0,0\n10,1,2,3\n20,0,x,0\n");
    const r = run(["--config", file("v2.json", "{}"), bad]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toBe(`${bad}:4:gyro_y: not a number\n`);
    const mark = file("m.csv", "t_ms,gyro_x,gyro_y,gyro_z,selected\n0,0,0,0,0\n10,0,0,0,2\n");
    expect(run(["--config", file("v3.json", "{}"), mark]).stderr).toBe(`${mark}:3:selected: not 0 or 1\n`);
  });
  it("bad configuration → exit 2 naming the field and rule", () => {
    const cfg = file("bad.json", '{\n  "frame": "device",\n  "gain": -2\n}\n');
    const r = run(["--config", cfg, samples]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(new RegExp(`^${cfg.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}:3:3: gain: `));
  });
  it("--start X,Y: the output starts there, and touch positions (pointer_x/y) put the cursor on the finger", () => {
    const taps = file("t.csv", "t_ms,gyro_x,gyro_y,gyro_z,pointer_x,pointer_y,selected\n0,0,0,0,,,\n10,0,0,0,400,90,0\n90,0,0,0,400,90,1\n300,0,0,0,,,0\n");
    const r = run(["--config", file("touch.json", '{ "technique": "touch", "displayMode": "cursor" }'), "--start", "200,150", taps]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe("t_ms,x_px,y_px\n0,200,150\n10,400,90\n90,400,90\n300,400,90\n");
    expect(run(["--config", file("v3.json", '{ "gain": 6 }'), "--start=10.5,-3", samples]).stdout.split("\n")[2]).toBe("100,-7.5,-9");
  });
  it("a configuration still saying snap-turn → exit 2 naming the new value, at the key's line and column", () => {
    const cfg = file("old.json", '{\n  "technique": "motion+stick",\n  "stickMode": "snap-turn"\n}\n');
    const r = run(["--config", cfg, samples]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toBe(`${cfg}:3:3: stickMode: "snap-turn" was renamed "heading" (the heading stick); use "heading"\n`);
  });
  it("bad new columns and a bad --start → exit 2, one line naming file, line and column", () => {
    const half = file("half.csv", "t_ms,gyro_x,gyro_y,gyro_z,pointer_x,pointer_y\n0,0,0,0,1,2\n10,0,0,0,5,\n");
    expect(run(["--config", file("c2.json", "{}"), half]).stderr).toBe(`${half}:3:pointer_y: empty while the other pointer position is given\n`);
    const sel = file("sel.csv", "t_ms,gyro_x,gyro_y,gyro_z,selected\n0,0,0,0,2\n");
    expect(run(["--config", file("c3.json", "{}"), sel]).stderr).toBe(`${sel}:2:selected: not 0 or 1\n`);
    const bad = run(["--config", file("c4.json", "{}"), "--start", "3", samples]);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/^replay: --start needs two numbers X,Y, got "3"/);
  });
});

describe("replay CLI: the cursor kept in the task area (--bounds W,H), as the runner keeps it", { timeout: 30_000 }, () => {
  it("stops the cursor at the area's edge; view mode ignores the bounds", () => {
    // W3C axes (science.md §7): 30 deg/s about y for 0.1 s is a 3° turn to the left, at 10 px per
    // degree 30 px, from x = 10 that would be x = −20: the edge stops it at 0; 10 deg/s about x
    // tilts the top edge towards the viewer, 1° down, +10 px
    const kept = run(["--config", file("cb.json", '{ "displayMode": "cursor", "pixelsPerDegree": 10 }'), "--start", "10,10", "--bounds", "500,300", samples]);
    expect(kept.status).toBe(0);
    expect(kept.stdout).toBe("t_ms,x_px,y_px\n0,10,10\n100,0,20\n200,0,20\n");
    const view = run(["--config", file("vb.json", '{ "gain": 6 }'), "--bounds=5,5", samples]);
    expect(view.stdout).toBe("t_ms,yaw_deg,pitch_deg\n0,0,0\n100,-18,-6\n200,-18,-6\n");
  });
  it("a finger put down after the edge stopped a drag brings the cursor under the finger (the engine is told where the edge left it)", () => {
    const touch = file("tb.csv", "t_ms,gyro_x,gyro_y,gyro_z,pointer_dx,pointer_dy,pointer_x,pointer_y\n0,0,0,0,,,,\n10,0,0,0,-50,0,,\n20,0,0,0,,,50,10\n");
    const r = run(["--config", file("tbc.json", '{ "technique": "touch", "displayMode": "cursor" }'), "--start", "10,10", "--bounds", "100,100", touch]);
    expect(r.stdout).toBe("t_ms,x_px,y_px\n0,10,10\n10,0,10\n20,50,10\n");
  });
  it("a bad --bounds → exit 2, one line, nothing on stdout", () => {
    for (const bad of ["0,100", "100", "a,b"]) {
      const r = run(["--config", file("bb.json", "{}"), "--bounds", bad, samples]);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe("");
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
      expect(r.stderr).toMatch(/^replay: --bounds needs /);
    }
  });
});

describe("replay CLI reproduces every technique's output, both display modes", { timeout: 120_000 }, () => {
  // The simulated participant's stream (each technique's live fields: gyroscope and accelerometer,
  // stick, pointer movement, touch positions, buttons, selection marks) through the CLI as a
  // researcher runs it: the rows marked `selected` must give the selection points the participant
  // logged, within the tolerance for the browser (0.5 px, 0.05°). A round trip (the stream
  // must carry every input the engine used), not an outside reference.
  const runAsync = promisify(execFile);
  const n = 9;
  const cursorRing = ringTargets(n, 400, { x: 640, y: 400 });
  const viewRing = ringTargets(n, 40, { x: 0, y: 0 }).map((p) => ({ x: p.x, y: -p.y }));
  const tasks = {
    cursor: { targets: ringVisitingOrder(n).map((i) => cursorRing[i]!), amplitude: ringAmplitude(n, 400), width: 40 },
    view: { targets: ringVisitingOrder(n).map((i) => viewRing[i]!), amplitude: ringAmplitude(n, 40), width: 4 },
  } as const;
  const techniques: TransferConfigInput[] = [
    { technique: "motion", frame: "gravity", gain: 3, smoothingTimeMs: 30, addedLatencyMs: 20 },
    { technique: "stick" },
    { technique: "motion+stick", stickMode: "heading", frame: "adaptive", gain: 2 },
    { technique: "motion+touch", gain: 1.5, pointerDegreesPerPixel: 0.25, pointerCursorGain: 1.5 },
    { technique: "mouse", pointerCursorGain: 1.5, pointerDegreesPerPixel: 0.15 },
    { technique: "touch", pointerDegreesPerPixel: 0.2 },
    { technique: "tilt-rate", gravityFilterTimeMs: 300, invertVertical: true },
  ];
  it("selection points within 0.5 px (cursor) or 0.05° (view)", async () => {
    const jobs = (["cursor", "view"] as const).flatMap((displayMode) =>
      techniques.map(async (base, k) => {
        const config = { ...base, displayMode, pixelsPerDegree: 12 };
        const sim = simulateSequence(tasks[displayMode], config, { seed: 40 + k, sensor: "phone", restMs: 300 });
        const name = `${base.technique}-${displayMode}`;
        const stream = file(`${name}.csv`, formatSampleCsv(sim.samples));
        const args = ["--config", file(`${name}.json`, JSON.stringify(config)), "--start", `${sim.start.x},${sim.start.y}`, "--bounds", "1280,800", stream];
        const { stdout } = await runAsync(process.execPath, ["--no-warnings", "experiments/cli/run.mjs", "replay", ...args], { maxBuffer: 64 << 20 });
        const rows = stdout.trim().split("\n").slice(1).map((l) => l.split(",").map(Number));
        const marked = sim.samples.flatMap((s, i) => (s.selected === 1 ? [rows[i]!] : []));
        return { name, tolerance: displayMode === "cursor" ? 0.5 : 0.05, marked, selections: sim.selections };
      }),
    );
    for (const { name, tolerance, marked, selections } of await Promise.all(jobs)) {
      expect(marked, name).toHaveLength(selections.length);
      marked.forEach((row, i) => expect(Math.hypot(row[1]! - selections[i]!.x, row[2]! - selections[i]!.y), `${name}, selection ${i}`).toBeLessThan(tolerance));
    }
  });
});
