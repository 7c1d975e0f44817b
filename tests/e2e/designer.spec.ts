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
