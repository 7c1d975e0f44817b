import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { fixtureDb } from "./fixtures/session-study";
import { PAD_REPORT_HZ, installGamepad, startStickPilot } from "./fixtures/inputs/gamepad";
import { SensorWorld } from "./fixtures/inputs/sensorWorld";
import { PHONE, expectReplayAgrees, finish, oneParticipant, onlyConfig, reachTask, techniqueDesign } from "./fixtures/inputs/inputStudy";

// Stick techniques through a stand-in for navigator.getGamepads (Chromium has no gamepad
// emulation; W3C Gamepad standard mapping, test code only). The stick alone runs with no
// gyroscope at all: the controller poll, once per animation frame, is its clock. Checks:
// (a) the replay of the stored stream reproduces every selection point; (c) the device check's
// controller rate is the stand-in's report rate (30 Hz, below the frame rate) within 10 %.

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

for (const displayMode of ["cursor", "view"] as const) {
  test(`stick, ${displayMode} mode: the right stick of a standard-mapping controller, no gyroscope; replay and rate agree`, async ({ page }) => {
    test.setTimeout(90_000);
    const design = techniqueDesign("stick", displayMode, { selection: "button", config: { stickMaxRateDegPerS: 90 } });
    const config = onlyConfig(design);
    const p = await oneParticipant(db, `Stick ${displayMode}`, design);
    await installGamepad(page);
    await page.goto(`/s/${p.token}`);
    await reachTask(page, { motion: false });
    await startStickPilot(page, { selectButton: 3, withinPx: displayMode === "cursor" ? 8 : 10 });
    expect(await finish(page)).toBe(p.completionCode);
    const s = await expectReplayAgrees(db, p.id, config, ["gamepad"]);
    expect(s.device.controllerRateHz).not.toBeNull();
    expect(Math.abs(s.device.controllerRateHz! - PAD_REPORT_HZ) / PAD_REPORT_HZ).toBeLessThanOrEqual(0.1);
    expect(s.trials.every((t) => t.timed_out === 0)).toBe(true);
  });
}

for (const [displayMode, stickMode] of [["cursor", "rate"], ["view", "heading"]] as const) {
  test(`motion+stick (${stickMode} stick), ${displayMode} mode: the emulated phone at rest and the stick; replay, bias and rates agree`, async ({ page }) => {
    test.setTimeout(90_000);
    const design = techniqueDesign("motion+stick", displayMode, { selection: "button", config: { stickMode, stickMaxRateDegPerS: 90 } });
    const config = onlyConfig(design);
    const p = await oneParticipant(db, `Motion stick ${displayMode}`, design);
    await installGamepad(page);
    const world = new SensorWorld(await page.context().newCDPSession(page), { rateHz: PHONE.rateHz, biasDegPerS: PHONE.gyroBiasDegPerS, noiseSdDegPerS: PHONE.gyroNoiseSdDegPerS, seed: 21 });
    await world.enable();
    world.still("flat");
    world.start();
    await page.goto(`/s/${p.token}`);
    await reachTask(page, { motion: true });
    if (stickMode === "rate") await startStickPilot(page, { selectButton: 3, withinPx: 8 });
    else {
      // the heading stick: push to the rim towards the target's heading, back to the centre, then select
      await page.evaluate(() => {
        const pad = (window as unknown as { __testPad: { set(a: number[] | null, b?: { index: number; pressed: boolean }): void } }).__testPad;
        let phase = 0, frames = 0;
        const step = (): void => {
          const c = document.querySelector<HTMLCanvasElement>("[data-testid=task-canvas]");
          if (!c) return;
          const ex = Number(c.dataset.nextX) - Number(c.dataset.aimX);
          const f = c.getBoundingClientRect().height / 2 / Math.tan(Math.PI / 6); // the runner's 60° vertical field of view
          const heading = Math.atan2(ex, f); // radians to the right
          frames++;
          if (phase === 0 && Math.abs(heading) > 0.03) {
            pad.set([0, 0, Math.sin(heading), -Math.cos(heading)]); // at the rim, pointing at the heading
            phase = 1;
            frames = 0;
          } else if (phase === 1 && frames > 4) {
            pad.set([0, 0, 0, 0]);
            phase = 2;
            frames = 0;
          } else if ((phase === 2 && frames > 12) || (phase === 0 && Math.abs(heading) <= 0.03)) {
            pad.set(null, { index: 3, pressed: true });
            phase = 3;
            frames = 0;
          } else if (phase === 3 && frames > 2) {
            pad.set(null, { index: 3, pressed: false });
            phase = 0;
            frames = 0;
          }
          requestAnimationFrame(step);
        };
        requestAnimationFrame(step);
      });
    }
    expect(await finish(page)).toBe(p.completionCode);
    await world.stop();
    const s = await expectReplayAgrees(db, p.id, config, ["generic-sensor", "gamepad"]);
    expect(s.bias).not.toBeNull();
    expect(Math.abs(s.bias!.biasYDegPerS - PHONE.gyroBiasDegPerS.y)).toBeLessThanOrEqual(0.15);
    expect(Math.abs(s.device.sampleRateHz! - PHONE.rateHz) / PHONE.rateHz).toBeLessThanOrEqual(0.1);
  });
}
