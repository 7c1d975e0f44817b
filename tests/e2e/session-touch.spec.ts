import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { ID1_CARD_WIDTH_MM } from "../../lib/runner";
import { createSessionStudy, fixtureDb, touchDesign, type SessionFixture } from "./fixtures/session-study";
import { completionCode, passChecks, tapUntilComplete } from "./fixtures/session-flow";

// A second participant on a phone-sized viewport with touch input: direct taps on the targets,
// sizes in mm after the card calibration (ID-1 card, 85.60 mm wide: ISO/IEC 7810).

test.use({ viewport: { width: 412, height: 915 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 });

/** JSON columns: text or already parsed, depending on the driver's column type. */
const json = (v: unknown): Record<string, number> => (typeof v === "string" ? JSON.parse(v) : v) as Record<string, number>;

let db: Knex;
let fx: SessionFixture;
test.beforeAll(async () => {
  db = fixtureDb();
  fx = await createSessionStudy(db, `Session touch ${Date.now()}`, touchDesign, 1);
});
test.afterAll(async () => {
  await db.destroy();
});

test("a phone participant taps through a session in mm", async ({ page }) => {
  test.setTimeout(120_000);
  const p = fx.participants[0]!;
  await page.goto(`/s/${p.token}`);
  await passChecks(page, { motion: false });
  await tapUntilComplete(page);
  expect(await completionCode(page)).toBe(p.completionCode);

  const trials = await db("trials").where({ participant_id: p.id }).select<{ unit: string; amplitude: number; to_x: number; to_y: number; end_x: number; end_y: number; hit: number }[]>("unit", "amplitude", "to_x", "to_y", "end_x", "end_y", "hit");
  expect(trials).toHaveLength(2 * 9);
  const calibration = await db("calibrations").where({ participant_id: p.id, kind: "card" }).first<{ result: string }>("result");
  // the card slider was set to 324 CSS px: 324 / 85.60 px per mm
  expect(json(calibration!.result).pixelsPerMm).toBeCloseTo(324 / ID1_CARD_WIDTH_MM, 9);
  for (const t of trials) {
    expect(t.unit).toBe("mm");
    expect(t.amplitude).toBe(40);
    // taps land on the target centre to within rounding of the drawn position (0.1 CSS px)
    expect(Math.hypot(t.end_x - t.to_x, t.end_y - t.to_y)).toBeLessThan(1);
    expect(t.hit).toBe(1);
  }
});
