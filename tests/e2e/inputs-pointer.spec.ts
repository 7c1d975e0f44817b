import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { fixtureDb } from "./fixtures/session-study";
import { aimAndTarget, pxToDeg, runMousePilot } from "./fixtures/inputs/mousePilot";
import { expectReplayAgrees, finish, oneParticipant, onlyConfig, reachTask, techniqueDesign } from "./fixtures/inputs/inputStudy";

// The mouse through Pointer Lock (real Playwright mouse events: CDP Input.dispatchMouseEvent)
// and touch through CDP Input.dispatchTouchEvent, one sequence each in both display modes;
// (a) the replay of the stored stream reproduces every selection point.

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

for (const displayMode of ["cursor", "view"] as const) {
  test(`mouse, ${displayMode} mode: Pointer Lock movement (gain applied), clicks select; the replay agrees`, async ({ page }) => {
    test.setTimeout(90_000);
    const gain = 2, degPerPx = 0.05;
    const design = techniqueDesign("mouse", displayMode, { selection: "click", config: { pointerCursorGain: gain, pointerDegreesPerPixel: degPerPx } });
    const config = onlyConfig(design);
    const p = await oneParticipant(db, `Mouse ${displayMode}`, design);
    await page.goto(`/s/${p.token}`);
    await reachTask(page, { motion: false });
    await runMousePilot(page, { displayMode, gain, degPerPx });
    expect(await finish(page)).toBe(p.completionCode);
    const s = await expectReplayAgrees(db, p.id, config, ["pointer-lock"]);
    // Pointer Lock 2.0: Chromium on Linux refuses unadjustedMovement (NotSupportedError); the plain lock is recorded as not raw
    expect(s.quality.pointerLockRaw).toBe(false);
    expect(s.trials.filter((t) => t.hit === 1).length).toBeGreaterThanOrEqual(4);
  });
}

test.describe(() => {
  test.use({ viewport: { width: 412, height: 915 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 });
  for (const displayMode of ["cursor", "view"] as const) {
    test(`touch, ${displayMode} mode on a phone: ${displayMode === "cursor" ? "the finger's position" : "drag deltas"} through CDP touch events; the replay agrees`, async ({ page }) => {
      test.setTimeout(90_000);
      const design = techniqueDesign("touch", displayMode, { selection: "tap", config: { pointerDegreesPerPixel: 0.1 } });
      const config = onlyConfig(design);
      const p = await oneParticipant(db, `Touch ${displayMode}`, design);
      await page.goto(`/s/${p.token}`);
      await reachTask(page, { motion: false });
      const cdp = await page.context().newCDPSession(page);
      const touch = (type: "touchStart" | "touchMove" | "touchEnd", x = 0, y = 0) => cdp.send("Input.dispatchTouchEvent", { type, touchPoints: type === "touchEnd" ? [] : [{ x, y }] });
      const canvas = page.getByTestId("task-canvas");
      for (let k = 0; k < 80 && (await canvas.isVisible()); k++) {
        const area = await canvas.boundingBox();
        const d = await aimAndTarget(page);
        if (!area || !d) break;
        if (displayMode === "cursor") {
          // touch the highlighted target where it is drawn
          const tx = Number(await canvas.getAttribute("data-next-x")), ty = Number(await canvas.getAttribute("data-next-y"));
          await touch("touchStart", area.x + tx, area.y + ty);
          await touch("touchEnd");
          await page.waitForTimeout(80);
          continue;
        }
        const dist = Math.hypot(d.ex, d.ey);
        const cx = area.x + area.width / 2, cy = area.y + area.height / 2;
        if (dist < 4) {
          await touch("touchStart", cx, cy); // a tap without movement selects
          await touch("touchEnd");
          await page.waitForTimeout(80);
          continue;
        }
        // drag: 0.1° per px; a drag to the right turns the view right, a drag up looks up
        const clamp = (v: number) => Math.max(-150, Math.min(150, v)); // long turns in several drags, as on a small screen
        const dx = clamp(pxToDeg(d.ex, d.h) / 0.1), dy = clamp(pxToDeg(d.ey, d.h) / 0.1);
        await touch("touchStart", cx, cy);
        for (let s = 1; s <= 8; s++) await touch("touchMove", cx + (dx * s) / 8, cy + (dy * s) / 8);
        await touch("touchEnd");
      }
      expect(await finish(page)).toBe(p.completionCode);
      const s = await expectReplayAgrees(db, p.id, config, [displayMode === "cursor" ? "touch-direct" : "touch-drag"]);
      expect(s.trials.filter((t) => t.hit === 1).length).toBeGreaterThanOrEqual(4);
    });
  }
});
