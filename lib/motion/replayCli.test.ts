import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

// The replay CLI as interfaces.md fixes it: `replay --config FILE.json SAMPLES.csv` → t_ms,yaw_deg,pitch_deg
// (view) or t_ms,x_px,y_px (cursor); bad input → exit 2, one line naming file, line and column.
const dir = mkdtempSync(join(tmpdir(), "replay-"));
const run = (args: string[]) => spawnSync(process.execPath, ["--import", "tsx", "--no-warnings", "experiments/cli/replay.ts", ...args], { encoding: "utf8", cwd: process.cwd() });
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
  it("bad sample → exit 2, one line naming file, line and column, nothing on stdout", () => {
    const bad = file("b.csv", "t_ms,gyro_x,gyro_y,gyro_z\n0,0,0,0\n10,1,2,3\n20,0,x,0\n");
    const r = run(["--config", file("v2.json", "{}"), bad]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toBe(`${bad}:4:gyro_y: not a number\n`);
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
