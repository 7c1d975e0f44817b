import { expect, test, type Page } from "@playwright/test";
import type { Knex } from "knex";
import { Quaternion, Vector3 } from "three";
import { fixtureDb } from "./fixtures/session-study";
import { SensorWorld } from "./fixtures/inputs/sensorWorld";
import { PHONE, expectReplayAgrees, finish, hitsOf, oneParticipant, onlyConfig, playSimulated, reachTask, restingAim, techniqueDesign, afterReadings } from "./fixtures/inputs/inputStudy";

// Motion techniques through Chromium's own sensor emulation (CDP Emulation.setSensorOverride*),
// one sequence each, in both display modes. The emulated phone is the simulated participant's:
// 60 Hz, its bias and noise (lib/motion/simulate/sensorProfiles.ts). Checks:
// (a) the stored stream replayed through `npm run replay` reproduces every selection point;
// (b) the bias the calibration measured equals the injected bias within 0.15 deg/s (the W3C
//     readings are coarsened to 0.1 deg/s by Chromium, so the mean of the noisy readings is
//     what can be recovered);
// (c) the rate the device check reports is the emulated 60 Hz within 10 %;
// (d) motion and motion+touch: the simulated participant, correcting by what it sees, hits at
//     least 4 of 5 targets (a runner that aims wrongly fails here; (a) cannot see it).

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

/** A page with the emulated phone's sensors on (without the Generic Sensor API when `deviceMotionOnly`). */
async function withSensors(page: Page, seed: number, deviceMotionOnly = false, accelerometerNegated = false): Promise<SensorWorld> {
  if (deviceMotionOnly) {
    // a browser without the Generic Sensor API: the runner falls back to DeviceMotion
    await page.addInitScript(() => {
      for (const name of ["Gyroscope", "Accelerometer", "GravitySensor", "LinearAccelerationSensor"]) delete (window as unknown as Record<string, unknown>)[name];
    });
  }
  const cdp = await page.context().newCDPSession(page);
  const world = new SensorWorld(cdp, { rateHz: PHONE.rateHz, biasDegPerS: PHONE.gyroBiasDegPerS, noiseSdDegPerS: PHONE.gyroNoiseSdDegPerS, seed, accelerometerNegated });
  await world.enable();
  world.still("flat");
  world.start();
  return world;
}

/** A smooth step from 0 (x ≤ 0) to 1 (x ≥ 1): 3x² − 2x³. */
function ramp(x: number): number {
  const c = Math.min(1, Math.max(0, x));
  return c * c * (3 - 2 * c);
}

function expectBiasAndRate(s: { bias: { biasXDegPerS: number; biasYDegPerS: number; biasZDegPerS: number } | null; device: { sampleRateHz: number | null } }): void {
  // (b) the injected bias, deg/s (W3C DeviceMotion rotationRate alpha/beta/gamma = rates about x/y/z)
  expect(s.bias).not.toBeNull();
  expect(Math.abs(s.bias!.biasXDegPerS - PHONE.gyroBiasDegPerS.x)).toBeLessThanOrEqual(0.15);
  expect(Math.abs(s.bias!.biasYDegPerS - PHONE.gyroBiasDegPerS.y)).toBeLessThanOrEqual(0.15);
  expect(Math.abs(s.bias!.biasZDegPerS - PHONE.gyroBiasDegPerS.z)).toBeLessThanOrEqual(0.15);
  // (c) the emulated rate
  expect(Math.abs(s.device.sampleRateHz! - PHONE.rateHz) / PHONE.rateHz).toBeLessThanOrEqual(0.1);
}

for (const displayMode of ["cursor", "view"] as const) {
  test(`motion, ${displayMode} mode: the simulated participant through the emulated sensors; replay, bias and rate agree`, async ({ page }) => {
    test.setTimeout(150_000); // a minute or less; several on a shared, loaded machine
    const design = techniqueDesign("motion", displayMode, { selection: "button" });
    const config = onlyConfig(design);
    const p = await oneParticipant(db, `Motion ${displayMode}`, design);
    // view mode runs without the Generic Sensor API, so both browser paths are driven
    const world = await withSensors(page, 11, displayMode === "view");
    await page.goto(`/s/${p.token}`);
    await reachTask(page, { motion: true });
    await playSimulated(page, world, config, { seed: 5, select: () => page.keyboard.press("Space") });
    expect(await finish(page)).toBe(p.completionCode);
    await world.stop();
    const s = await expectReplayAgrees(db, p.id, config, [displayMode === "view" ? "device-motion" : "generic-sensor"]);
    expectBiasAndRate(s);
    expect(s.quality.inputAgeMedianMs).not.toBeNull();
    // (d) the aim: at least 4 of 5 hits (hitsOf says why)
    expect(hitsOf(s), "hits of 5").toBeGreaterThanOrEqual(4);
  });
}

const tiltCases = [
  { displayMode: "cursor", negated: false, name: "tilt-rate, cursor mode: tilting the emulated device drives the aim; replay, bias and rate agree" },
  { displayMode: "view", negated: false, name: "tilt-rate, view mode: tilting the emulated device drives the aim; replay, bias and rate agree" },
  { displayMode: "cursor", negated: true, name: "tilt-rate on a device that reports acceleration negated: the device check turns it round and records it; the aim follows the tilt" },
] as const;
for (const { displayMode, negated, name } of tiltCases) {
  test(name, async ({ page }) => {
    test.setTimeout(150_000); // a minute or less; several on a shared, loaded machine
    const design = techniqueDesign("tilt-rate", displayMode, { selection: "button" });
    const config = onlyConfig(design);
    const p = await oneParticipant(db, `Tilt ${displayMode}${negated ? " negated" : ""}`, design);
    const world = await withSensors(page, 12, false, negated);
    await page.goto(`/s/${p.token}`);
    // tilt-rate takes "up" from the accelerometer: the device check asks for the tilting part too
    await reachTask(page, { motion: true, tilt: world });
    // Closed loop, as a person would: tilt towards the highlighted target (the further away, the
    // more), level the device near it, press Space. Tilting the right edge down is a tilt to
    // the right; tilting the top edge away, forward (science.md §8 signs).
    const base = new Quaternion(); // flat, screen up
    const canvas = page.getByTestId("task-canvas");
    // Intermittent corrections (as playSimulated's): tilt for 400 ms, level, look again once the
    // aim rests; press when it rests within the target's middle (cursor W/4 of its centre, view about W/6).
    const within = displayMode === "cursor" ? 12 : 10;
    for (const deadline = Date.now() + 75_000; Date.now() < deadline && (await canvas.isVisible()); ) {
      const d = await restingAim(page, within / 4);
      if (!d) break;
      if (!Number.isFinite(d.ex) || !Number.isFinite(d.ey)) {
        await page.waitForTimeout(50);
        continue;
      }
      const dist = Math.hypot(d.ex, d.ey);
      if (dist < within) {
        await page.keyboard.press("Space");
        // wait until the page has taken the selection (or the task area went away)
        for (let w = 0; w < 30; w++) {
          const after = await restingAim(page, Infinity);
          if (!after || after.trial > d.trial) break;
          await page.waitForTimeout(50);
        }
        continue;
      }
      // further away, more tilt; just past the default 5° dead zone (tiltDeadZoneDeg) when close
      const deg = Math.min(20, 5.5 + dist / 20);
      // right (ex > 0): about the device y axis (top edge), right side down; down the screen (ey > 0): top edge towards the person
      const axis = new Vector3(d.ey / dist, d.ex / dist, 0).normalize();
      const tilted = base.clone().multiply(new Quaternion().setFromAxisAngle(axis, (deg * Math.PI) / 180));
      // tilt and level again over 400 ms (80 ms smooth ramps either side of a hold), as a smooth
      // movement whose gyroscope rates stay smooth (SensorWorld.path says why that matters)
      await world.path((t) => new Quaternion().slerpQuaternions(base, tilted, ramp(Math.min(t, 0.4 - t) / 0.08)), 0.4);
      await afterReadings(page, world);
    }
    expect(await finish(page)).toBe(p.completionCode);
    await world.stop();
    const s = await expectReplayAgrees(db, p.id, config, ["generic-sensor"]);
    expectBiasAndRate(s);
    if (!negated) {
      // the emulated accelerometer reads +9.8 m/s² on z lying flat, screen up (W3C Device
      // Orientation and Motion), and turns with the gyroscope: the sign check finds it normal
      expect(s.device.gravitySign).toBe("normal");
      expect(s.quality.accelerometerInverted ?? false).toBe(false);
    } else {
      // −9.8 on z lying flat, screen up, against the W3C's +9.8: negated as a whole (which the
      // gyroscope comparison cannot see: dĝ/dt = −ω × ĝ holds for −ĝ too), so turned round and recorded
      expect(s.device.gravitySign).toBe("inverted");
      expect(s.quality.accelerometerInverted).toBe(true);
      // and the aim follows the tilt: "up" taken the wrong way round reverses both tilt axes, so
      // the corrections would drive the aim away and no press would land (at most 2 of 5 by chance)
      expect(hitsOf(s), "hits of 5").toBeGreaterThanOrEqual(3);
    }
  });
}

for (const displayMode of ["cursor", "view"] as const) {
  test.describe(() => {
    test.use({ viewport: { width: 412, height: 915 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 });
    test(`motion+touch, ${displayMode} mode on a phone: device motion plus a touch drag, selection by a tap; replay, bias and rate agree`, async ({ page }) => {
      test.setTimeout(150_000); // a minute or less; several on a shared, loaded machine
      const design = techniqueDesign("motion+touch", displayMode, { selection: "tap", config: { pointerDegreesPerPixel: 0.1, pointerCursorGain: 1 } });
      const config = onlyConfig(design);
      const p = await oneParticipant(db, `Motion touch ${displayMode}`, design);
      const world = await withSensors(page, 13);
      await page.goto(`/s/${p.token}`);
      await reachTask(page, { motion: true });
      const area = (await page.getByTestId("task-canvas").boundingBox())!;
      const cdp = await page.context().newCDPSession(page);
      const touch = (type: "touchStart" | "touchMove" | "touchEnd", x: number, y: number) => cdp.send("Input.dispatchTouchEvent", { type, touchPoints: type === "touchEnd" ? [] : [{ x, y }] });
      // a drag of 60 px to the right on the task area first (the second channel), then the taps
      const x0 = area.x + 40, y0 = area.y + area.height - 40;
      await touch("touchStart", x0, y0);
      for (let k = 1; k <= 6; k++) await touch("touchMove", x0 + 10 * k, y0);
      await touch("touchEnd", 0, 0);
      await playSimulated(page, world, config, { seed: 7, select: () => page.touchscreen.tap(area.x + 30, area.y + 30) });
      expect(await finish(page)).toBe(p.completionCode);
      await world.stop();
      const s = await expectReplayAgrees(db, p.id, config, ["generic-sensor", "touch-drag"]);
      expectBiasAndRate(s);
      // (d) the aim: at least 4 of 5 hits (hitsOf says why)
      expect(hitsOf(s), "hits of 5").toBeGreaterThanOrEqual(4);
      // the drag reached the stream: pointer deltas summing to its 60 px
      const header = s.streamCsv.split("\n")[0]!.split(",");
      const dx = header.indexOf("pointer_dx");
      const sum = s.streamCsv.trim().split("\n").slice(1).reduce((a, l) => a + (Number(l.split(",")[dx]) || 0), 0);
      expect(sum).toBeCloseTo(60, 0);
    });
  });
}
