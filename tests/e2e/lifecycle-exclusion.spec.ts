import { expect, test } from "@playwright/test";
import { readZip } from "../fixtures/readZip";
import { apiAsRole } from "./helpers";
import { TWO_GAINS, lifecycleStudy, signedIn } from "./fixtures/lifecycle";

// An exclusion changes the results (n and the means) and appears in the archive: exclusions.csv
// with the reason, and the methods text.


test("an exclusion changes the results and appears in the archive's methods", async ({ page }) => {
  test.setTimeout(150_000);
  const api = await apiAsRole("researcher");
  const studyId = await lifecycleStudy(api, null, TWO_GAINS, "draft");
  // four different people (a wide spread between them), included in the results
  const sim = await api.post(`/api/studies/${studyId}/pilots/simulated`, { data: { participants: 4, spread: 0.4, include: true, seed: 20261203 } });
  expect(sim.status(), await sim.text()).toBe(201);
  const { simulated } = (await sim.json()) as { simulated: { codes: string[] } };
  await api.dispose();

  await signedIn(page, "researcher");
  await page.goto(`/studies/${studyId}/results`);
  const row = page.getByRole("row").filter({ has: page.getByRole("cell", { name: "gain 2", exact: true }) });
  await expect(row.getByRole("cell").nth(1)).toHaveText("4", { timeout: 30_000 });
  const before = await row.getByRole("cell").nth(2).textContent();

  const code = simulated.codes[0]!;
  const reason = "held the phone flat against the table the whole time";
  await page.goto(`/studies/${studyId}/participants`);
  await page.getByRole("table", { name: "Pilots" }).getByRole("link", { name: code }).click();
  await page.getByLabel("Exclude the whole participant: reason").fill(reason);
  await page.getByRole("button", { name: `Exclude ${code}` }).click();
  await expect(page.getByRole("status").filter({ hasText: `${code} is excluded.` })).toBeVisible({ timeout: 20_000 });
  await expect(page.getByText(`${code} is excluded: ${reason}.`)).toBeVisible({ timeout: 20_000 }); // the page, refreshed from the server

  await page.goto(`/studies/${studyId}/results`);
  await expect(row.getByRole("cell").nth(1)).toHaveText("3", { timeout: 30_000 });
  expect(await row.getByRole("cell").nth(2).textContent()).not.toBe(before);
  await expect(page.getByTestId("researcher-exclusions")).toContainText(`1 participant(s) and 0 sequence(s) excluded by the team: ${code}: ${reason} (36 movements)`);

  const [posted] = await Promise.all([
    page.waitForResponse((r) => r.url().endsWith(`/api/studies/${studyId}/exports`) && r.request().method() === "POST"),
    page.getByRole("button", { name: "Start export" }).click(),
  ]);
  const { export: job } = (await posted.json()) as { export: { id: number } };
  const exportRow = page.getByTestId(`export-${job.id}`);
  await expect(exportRow.getByText("done", { exact: true })).toBeVisible({ timeout: 45_000 });
  const [download] = await Promise.all([page.waitForEvent("download"), exportRow.getByRole("link", { name: "Download" }).click()]);
  const files = await readZip(await download.path());
  const methods = files.get("methods.md")!.toString("utf8");
  expect(methods).toContain(`The research team excluded 1 participant (36 movements) before analysis: ${reason} (1).`);
  const exclusions = files.get("exclusions.csv")!.toString("utf8").trim().split("\n");
  expect(exclusions).toHaveLength(2);
  expect(exclusions[1]).toContain(`participant,,,,${reason},36`);
  expect(files.get("trials.csv")!.toString("utf8").trim().split("\n")).toHaveLength(1 + 3 * 2 * 2 * 9);
  for (const [, bytes] of files) expect(bytes.toString("utf8").includes(code)).toBe(false); // pseudonyms only
});
