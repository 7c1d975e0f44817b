import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { expect, test } from "@playwright/test";
import { FINISHED_STUDY } from "../../db/seeds/demo-finished-study";
import { DEMO_PEOPLE } from "../../db/seeds/demo-scenario";
import { readZip } from "../fixtures/readZip";
import { apiAs, apiAsRole, demo, signInWithForm } from "./helpers";

test("a researcher opens the demo study's results, sees the plots, exports, watches progress and downloads", async ({ page }) => {
  test.setTimeout(300_000); // several recomputations of the analysis, path accuracy replayed from 384 streams within a time budget per request, and an export, on a shared machine
  const owner = demo("researcher");
  await signInWithForm(page, owner.email, owner.password);
  await page.waitForURL(/\/studies/);
  const api = await apiAsRole("researcher");
  const studies = (await (await api.get("/api/studies")).json()) as { studies: { id: number; title: string }[] };
  const study = studies.studies.find((s) => s.title === FINISHED_STUDY.title)!;
  await page.goto(`/studies/${study.id}/results`);
  await expect(page.getByRole("heading", { name: `Results: ${FINISHED_STUDY.title}` })).toBeVisible();
  for (const id of ["tp", "errors", "fitts", "learning", "endpoints"]) {
    const fig = page.getByTestId(`figure-${id}`);
    await expect(fig).toBeVisible({ timeout: 30_000 }); // the first analysis may take a while on a busy machine
    await expect(fig.locator("figcaption")).toContainText(/bits|ms|%|W/);
    await expect(fig.locator("svg.recharts-surface").first()).toBeVisible();
  }
  // 12 completed participants, 4 conditions on the TP chart's axis
  await expect(page.getByTestId("progress-table")).toContainText("12 of 12 planned have completed");
  for (const c of ["motion / low", "motion / high", "touch / low", "touch / high"]) await expect(page.getByTestId("figure-tp").locator("svg")).toContainText(c);
  // path accuracy from the recorded streams: 12 participants × 4 conditions × 8 sequences
  await expect(page.getByTestId("path-accuracy")).toContainText(/Path measures from the recorded streams: \d+ of 384 sequences/);
  await expect(page.getByRole("heading", { name: "Statistics" })).toBeVisible();
  await expect(page.getByRole("cell", { name: /^(gain:technique|technique:gain)$/ }).first()).toBeVisible();
  await expect(page.getByTestId("exclusions")).toContainText(/movements removed: \d+ as misfires/);
  // another exclusion rule: the page recomputes and counts what each rule removed
  await page.getByLabel("Remove").selectOption("misfire+mt3sd");
  await expect(page.getByTestId("exclusions")).toContainText("then MT outliers beyond the participant × condition's mean ± 3 SD", { timeout: 30_000 });
  await expect(page.getByTestId("exclusions")).toContainText(/\d+ as movement-time outliers/);
  await page.getByLabel("Remove").selectOption("misfire");

  // start an export with stable pseudonyms and streams; watch the progress bar; download
  await page.getByLabel(/stable pseudonyms/).check();
  await page.getByLabel(/raw sensor streams/).check();
  const [posted] = await Promise.all([
    page.waitForResponse((r) => r.url().endsWith(`/api/studies/${study.id}/exports`) && r.request().method() === "POST"),
    page.getByRole("button", { name: "Start export" }).click(),
  ]);
  expect(posted.status()).toBe(202);
  const { export: job } = (await posted.json()) as { export: { id: number } };
  const row = page.getByTestId(`export-${job.id}`);
  await expect(row.getByRole("progressbar").or(row.getByText("done"))).toBeVisible();
  await expect(row.getByText("done", { exact: true })).toBeVisible({ timeout: 45_000 });
  const sha = (await row.locator("code").innerText()).trim();
  expect(sha).toMatch(/^[0-9a-f]{64}$/);
  const [download] = await Promise.all([page.waitForEvent("download"), row.getByRole("link", { name: "Download" }).click()]);
  const path = await download.path();
  const bytes = readFileSync(path);
  expect(createHash("sha256").update(bytes).digest("hex")).toBe(sha);
  const names = [...(await readZip(path)).keys()];
  for (const f of ["trials.csv", "sequences.csv", "cells.csv", "conditions.csv", "participants.csv", "questionnaires.csv", "datapackage.json", "codebook.md", "methods.md", "consent/consent-v1.md"]) expect(names).toContain(f);
  expect(names.filter((n) => n.startsWith("streams/")).length).toBe(12 * 4 * 9); // 8 sequences + 1 practice per condition

  // a participant page: trajectory and sequences with flags
  await page.goto(`/studies/${study.id}/results`);
  await page.getByRole("region", { name: "Participants", exact: true }).getByRole("link").first().click();
  await expect(page.getByTestId("figure-trajectory")).toBeVisible({ timeout: 30_000 }); // replays the streams
  await expect(page.getByTestId("participant-sequences")).toContainText("motion");
  await api.dispose();
});

test("the consent register: owner and reviewers get the CSV; the editor does not", async () => {
  const owner = await apiAsRole("researcher");
  const studies = (await (await owner.get("/api/studies")).json()) as { studies: { id: number; title: string }[] };
  const id = studies.studies.find((s) => s.title === FINISHED_STUDY.title)!.id;
  const csv = await (await owner.get(`/api/studies/${id}/consent-register`)).text();
  expect(csv.split("\n")[0]).toBe("participant_code,status,consent_version,version_hash,document_sha256,signed_at,withdrawn_at,typed_name,agreed,erased_at");
  expect(csv.trim().split("\n")).toHaveLength(13);
  const priya = DEMO_PEOPLE.find((p) => p.email.startsWith("priya@"))!;
  const editor = await apiAs(priya.email, priya.password);
  expect((await editor.get(`/api/studies/${id}/consent-register`)).status()).toBe(403);
  // the editor is on the team: results yes, register no
  expect((await editor.get(`/api/studies/${id}/results`)).status()).toBe(200);
  const reviewer = await apiAsRole("reviewer");
  expect((await reviewer.get(`/api/studies/${id}/consent-register`)).status()).toBe(200);
  expect((await reviewer.get(`/api/studies/${id}/results`)).status()).toBe(403);
  for (const c of [owner, editor, reviewer]) await c.dispose();
});
