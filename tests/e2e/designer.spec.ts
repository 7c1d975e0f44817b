import { expect as baseExpect, test, type Page } from "@playwright/test";
import { demo, signInWithForm } from "./helpers";

// The machine may be shared and busy: give page updates room, the test's total stays bounded.
const expect = baseExpect.configure({ timeout: 15_000 });
test.setTimeout(180_000);

async function newStudy(page: Page, title: string): Promise<number> {
  await signInWithForm(page, demo("researcher").email, demo("researcher").password);
  await expect(page).toHaveURL(/\/studies/);
  await page.getByLabel("Title", { exact: true }).fill(title);
  await page.getByLabel("Summary").fill("Technique by gain, built with the settings editor (test scenario).");
  await page.getByRole("button", { name: "Create study" }).click();
  await expect(page).toHaveURL(/\/studies\/\d+\/design$/);
  return Number(page.url().match(/studies\/(\d+)/)![1]);
}

const field = (page: Page, name: string) => page.getByLabel(name, { exact: true });

test("a 2 (technique) × 3 (gain) study built only with the settings editor and presets: field errors, curves that follow the gain, fit and time checks", async ({ page }) => {
  await newStudy(page, `Editor-built technique × gain ${Date.now()}`);

  // The base settings start from a preset; its sentence says when to use it.
  await field(page, "Base preset").selectOption({ label: "Phone upright, gentle gain" });
  await expect(page.locator("#base-preset-when")).toContainText("gains of 1–3 suit newcomers");
  await page.getByRole("button", { name: "Base: apply preset" }).click();
  await expect(field(page, "Base CD gain")).toHaveValue("2.5");

  // Technique: motion (already) and stick, chosen in the editor.
  await page.getByRole("button", { name: "Add level to factor 1" }).click();
  await page.getByLabel("Factor 1 level 2 label").fill("stick");
  await field(page, "Factor 1 level 2 Input technique").selectOption("stick");
  // Only what the stick uses is offered for it (no gyroscope gain), and what it changes from the base is listed.
  const stickLevel = page.getByTestId("settings-f0-l1");
  await expect(stickLevel.getByLabel("Factor 1 level 2 Stick top rate", { exact: true })).toBeVisible();
  await expect(page.getByLabel("Factor 1 level 2 changes from the base")).toContainText("Input technique motion → stick");

  // Gain: three levels typed into the CD gain field; gain 0 is refused at the field.
  await page.getByRole("button", { name: "Add factor" }).click();
  await page.getByLabel("Factor 2 name").fill("gain");
  const gains = ["2", "4", "6"];
  for (const [i, g] of gains.entries()) {
    if (i > 0) await page.getByRole("button", { name: "Add level to factor 2" }).click();
    await page.getByLabel(`Factor 2 level ${i + 1} label`).fill(`gain ${g}`);
    await field(page, `Factor 2 level ${i + 1} CD gain`).fill(i === 0 ? "0" : g);
  }
  await expect(page.locator('[id="err-factors.1.levels.0.config.gain"]')).toHaveText("must be greater than 0");
  await field(page, "Factor 2 level 1 CD gain").fill("2");
  await expect(page.locator('[id="err-factors.1.levels.0.config.gain"]')).toHaveCount(0);

  // A two-level curve whose fast speed is below its slow speed is refused at the fast speed.
  await field(page, "Base Gain curve").selectOption("two-level");
  await field(page, "Base Slow speed").fill("20");
  await field(page, "Base Fast speed").fill("10");
  await expect(page.locator('[id="err-baseConfig.curveFastSpeedDegPerS"]')).toHaveText("must be greater than the slow speed");
  await field(page, "Base Fast speed").fill("40");
  await expect(page.locator('[id="err-baseConfig.curveFastSpeedDegPerS"]')).toHaveCount(0);
  await field(page, "Base Gain curve").selectOption("constant");

  // A cursor task whose 480 px ring does not fit a portrait phone (ISO ring: D = A / cos(π/2n) + W > 390 px).
  await page.getByLabel("Display mode", { exact: true }).selectOption("cursor");
  await page.getByLabel("Unit", { exact: true }).selectOption("px");
  await page.getByLabel("Amplitudes (A)").fill("480");
  await page.getByLabel("Widths (W)").fill("60");
  await page.getByLabel("Planned participants (N)").fill("12");

  // The curves follow the gain: at 30 °/s, gain 2 gives 60 °/s × 10 px/° (the default pixels per degree) = 600 px/s.
  const readout = page.getByTestId("gain-curve-readout");
  await expect(readout).toContainText("motion / gain 2 → 600 px/s");
  await expect(readout).toContainText("motion / gain 6 → 1800 px/s");
  await expect(page.getByTestId("turn-readout")).toContainText("motion / gain 4: 1200 px quick"); // 30° × 4 × 10 px/°
  await field(page, "Factor 2 level 3 CD gain").fill("7");
  await expect(readout).toContainText("motion / gain 6 → 2100 px/s");
  await expect(page.getByTestId("figure-stick-response")).toBeVisible();

  // Fit warning for the portrait phone; time from the simulated participant.
  await expect(page.getByLabel("Fit warnings")).toContainText("phone, portrait: A 480 × W 60 px does not fit");
  await expect(page.getByLabel("Expected time")).toContainText(/About \d+ minutes per session/, { timeout: 30_000 });

  await page.getByRole("button", { name: "Save design" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Design saved." })).toBeVisible();
  // Reloaded, the levels keep their settings (no key was typed).
  await page.reload();
  await expect(page.getByLabel("Factor 2 level 3 changes from the base")).toContainText("CD gain 2.5 → 7");
});

test("try this level: the real task with a mouse on this computer, and on a phone-sized context through the short link with Chromium's sensor emulation", async ({ page, browser }) => {
  const { apiAsRole } = await import("./helpers");
  const { ringTargets, ringVisitingOrder } = await import("../../lib/task");
  const api = await apiAsRole("researcher");
  const { study } = (await (await api.post("/api/studies", { data: { title: `Try a level ${Date.now()}` } })).json()) as { study: { id: number } };
  const design = {
    factors: [{ name: "technique", levels: [{ label: "mouse", config: { technique: "mouse", pointerCursorGain: 1 } }, { label: "motion gain 2", config: { technique: "motion", gain: 2 } }] }],
    task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [200], widths: [40], targetsPerRing: 9, selection: "click" },
    counterbalancing: { method: "williams", seed: 1 },
  };
  expect((await api.put(`/api/studies/${study.id}/design`, { data: design })).status()).toBe(200);
  await api.dispose();

  await signInWithForm(page, demo("researcher").email, demo("researcher").password);
  await expect(page).toHaveURL(/\/studies/);
  await page.goto(`/studies/${study.id}/design`);

  // With a mouse: the mouse level's ring, each target clicked in the ISO visiting order with real mouse events.
  await page.getByLabel("Condition to try").selectOption({ label: "mouse" });
  await page.getByRole("button", { name: "Try this level" }).click();
  const here = await page.getByRole("link", { name: "Open it on this computer" }).getAttribute("href");
  const tryPage = await page.context().newPage();
  await tryPage.goto(here!);
  await expect(tryPage.getByText("Nothing is recorded")).toBeVisible();
  await tryPage.getByRole("button", { name: "Start" }).click();
  const canvas = tryPage.locator("canvas");
  await expect(canvas).toBeVisible();
  const area = (await canvas.boundingBox())!;
  const ring = ringTargets(9, 200 / Math.cos(Math.PI / 18)); // ISO 9241-411: nominal A is the chord, D = A / cos(π/2n)
  // the mouse runs through Pointer Lock: a first click on the start target takes the pointer, then its movements move the cursor from there
  const first = ring[ringVisitingOrder(9)[0]!]!;
  await tryPage.mouse.move(area.x + area.width / 2 + first.x, area.y + area.height / 2 + first.y);
  await tryPage.mouse.click(area.x + area.width / 2 + first.x, area.y + area.height / 2 + first.y);
  await expect.poll(() => tryPage.evaluate(() => document.pointerLockElement !== null)).toBe(true);
  for (const k of ringVisitingOrder(9)) {
    await tryPage.mouse.move(area.x + area.width / 2 + ring[k]!.x, area.y + area.height / 2 + ring[k]!.y, { steps: 4 });
    await tryPage.mouse.down();
    await tryPage.mouse.up();
  }
  await expect(tryPage.getByTestId("try-movements")).toHaveText("9 movements, 9 hits");

  // On a phone: the short link (as its QR code says), opened without an account; 30° of emulated rotation at gain 2.
  await page.getByLabel("Condition to try").selectOption({ label: "motion gain 2" });
  await page.getByRole("button", { name: "Try this level" }).click();
  const shortUrl = await page.getByTestId("short-link-url").textContent();
  expect(shortUrl).toMatch(/\/go\/[A-Za-z0-9]{8}$/);
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  const p = await phone.newPage();
  const cdp = await phone.newCDPSession(p);
  // W3C Generic Sensor / Device Orientation and Motion: readings in rad/s and m/s²; devicemotion needs all three of
  // gyroscope, accelerometer and linear-acceleration (Chromium's emulation, CDP Emulation.setSensorOverride*).
  for (const type of ["gyroscope", "accelerometer", "linear-acceleration", "gravity"]) {
    await cdp.send("Emulation.setSensorOverrideEnabled", { enabled: true, type, metadata: { available: true, minimumFrequency: 1, maximumFrequency: 60 } } as never);
  }
  const set = (type: string, x: number, y: number, z: number) => cdp.send("Emulation.setSensorOverrideReadings", { type, reading: { xyz: { x, y, z } } } as never);
  await set("gyroscope", 0, 0, 0);
  await set("accelerometer", 0, 9.80665, 0); // held upright: gravity along the screen's y axis
  await set("linear-acceleration", 0, 0, 0);
  await set("gravity", 0, 9.80665, 0);
  await p.goto(shortUrl!.replace(/^https?:\/\/[^/]+/, ""));
  await expect(p).toHaveURL(/\/try\//);
  await p.getByRole("button", { name: "Start" }).tap();
  await expect(p.locator("canvas")).toBeVisible();
  await p.getByRole("button", { name: "Reset the reading" }).tap();
  await p.waitForTimeout(300);
  // 30°/s about the screen-up axis for one second: a 30° turn
  const rate = (30 * Math.PI) / 180;
  const t0 = Date.now();
  await set("gyroscope", 0, rate, 0);
  await p.waitForTimeout(1000);
  await set("gyroscope", 0, 0, 0);
  const heldMs = Date.now() - t0;
  await p.waitForTimeout(500);
  const device = Number(await p.getByTestId("try-device-deg").textContent());
  const moved = Number(await p.getByTestId("try-output").textContent());
  // The device turned by what the emulation delivered while the reading was held (CDP round trips on a busy machine
  // stretch the second, so only a broad range is asked of it) …
  expect(device).toBeGreaterThan(20);
  expect(device).toBeLessThan(30 * (heldMs / 1000) * 1.15 + 1);
  // … and the cursor moved gain × device degrees × pixels per degree: 2 × 10 px per device degree, so a 30° turn moves
  // 60° × 10 px/° = 600 px (CD gain: view degrees per device degree, common practice).
  expect(moved / device).toBeGreaterThan(20 * 0.97);
  expect(moved / device).toBeLessThan(20 * 1.03);
  await phone.close();
});
