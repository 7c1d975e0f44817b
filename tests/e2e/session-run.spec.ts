import { readFileSync } from "node:fs";
import { gunzipSync } from "node:zlib";
import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { analyzeTrials } from "../../lib/analysis";
import type { TrialRow } from "../../lib/trials";
import { readZip } from "../fixtures/readZip";
import { demo, mailTo, signInWithForm } from "./helpers";
import { createSessionStudy, fixtureDb, motionDesign, type SessionFixture } from "./fixtures/session-study";
import { answerStep, completionCode, passChecks } from "./fixtures/session-flow";

// A whole session in Chromium, driven by the simulated participant (test builds only:
// NEXT_PUBLIC_YAWPOINT_TEST_SOURCES=1 and ?source=simulated), with a reload mid-block and the
// network dropped for a while. Then the database must hold every movement exactly once, and the
// analysis must recover the simulated participant's throughput within its sampling error.

/** JSON columns: text or already parsed, depending on the driver's column type. */
const json = (v: unknown): Record<string, number> => (typeof v === "string" ? JSON.parse(v) : v) as Record<string, number>;

let db: Knex;
let fx: SessionFixture;
// the second test reads what the first one's session recorded
test.describe.configure({ mode: "serial" });

test.beforeAll(async () => {
  db = fixtureDb();
  fx = await createSessionStudy(db, `Session run ${Date.now()}`, motionDesign, 1);
});
test.afterAll(async () => {
  await db.destroy();
});

/** Simulated person (components/participant/testSource.ts): MT = 200 + 150·log2(A/W + 1) ms, endpoint SD = W/4.133. */
const INTERCEPT_MS = 200, SLOPE_MS_PER_BIT = 150;

test("a whole session with the simulated participant: reload mid-block, offline for a while, every movement once, throughput recovered", async ({ page, context }) => {
  test.setTimeout(240_000);
  const p = fx.participants[0]!;
  await page.goto(`/s/${p.token}?source=simulated`);
  await passChecks(page, { typedName: "Alex Example", email: "alex@participant.example", motion: true });

  // consent copy by e-mail, with the version's hash
  await expect.poll(async () => (await mailTo("alex@participant.example")).length, { timeout: 10_000 }).toBeGreaterThan(0);
  expect((await mailTo("alex@participant.example")).at(-1)!.text).toContain(fx.consentHash);

  let reloaded = false, wentOffline = false;
  const deadline = Date.now() + 200_000;
  while (Date.now() < deadline) {
    if (await page.getByTestId("completion-code").isVisible()) break;
    const label = (await page.getByTestId("round-label").textContent({ timeout: 500 }).catch(() => null)) ?? "";
    const trial = Number((await page.getByTestId("task-canvas").getAttribute("data-trial", { timeout: 500 }).catch(() => null)) ?? "0");
    if (!reloaded && label.startsWith("Round 1 of") && trial >= 5) {
      await page.reload(); // mid-block: the unfinished round starts again, nothing is stored twice
      reloaded = true;
      continue;
    }
    if (!wentOffline && label.startsWith("Round 2 of") && trial >= 3) {
      await context.setOffline(true);
      wentOffline = true;
      // the round finishes offline; its data waits on the device
      await expect(page.getByTestId("upload-status")).toContainText("kept on this device", { timeout: 30_000 });
      await page.waitForTimeout(3000);
      await context.setOffline(false);
      continue;
    }
    if (!(await answerStep(page))) await page.waitForTimeout(300);
  }
  expect(reloaded && wentOffline, "the reload and the offline spell both happened").toBe(true);
  expect(await completionCode(page)).toBe(p.completionCode);

  // every movement exactly once: 2 conditions × (1 practice + 2 measured) sequences × 13 movements
  const streams = await db("sequence_streams").where({ participant_id: p.id }).select("upload_key", "movement_count", "sample_count");
  expect(streams).toHaveLength(6);
  const trials = await db("trials").where({ participant_id: p.id }).orderBy(["practice", "condition_index", "sequence", "trial"]);
  expect(trials).toHaveLength(6 * 13);
  const keys = new Set(trials.map((t: { practice: number; condition_index: number; sequence: number; trial: number }) => `${t.practice}:${t.condition_index}:${t.sequence}:${t.trial}`));
  expect(keys.size).toBe(trials.length);
  for (const s of streams as { sample_count: number }[]) expect(s.sample_count).toBeGreaterThan(100);
  const quality = await db("sequence_streams").where({ participant_id: p.id }).select("quality");
  for (const q of quality as { quality: string }[]) expect(json(q.quality).droppedSamples).toBe(0);
  const stored = await db("participants").where({ id: p.id }).first<{ status: string; device: string }>();
  expect(stored?.status).toBe("completed");
  expect(json(stored!.device).sampleRateHz).toBeGreaterThan(50); // the phone profile reports ≈ 60 Hz
  expect(await db("questionnaire_answers").where({ participant_id: p.id }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 2 + 3 }]);

  // analysis (ISO 9241-411 effective throughput, mean of means) recovers the simulated person
  type Stored = { practice: number; condition: string; block: number; sequence: number; trial: number; amplitude: number; width: number; time_ms: number; hit: number; from_x: number; from_y: number; to_x: number; to_y: number; start_x: number; start_y: number; end_x: number; end_y: number };
  const rows: TrialRow[] = (trials as Stored[]).filter((t) => !t.practice).map((t) => ({
    participant: p.code, condition: t.condition, block: t.block, sequence: t.sequence, trial: t.trial, amplitude: t.amplitude, width: t.width,
    timeMs: t.time_ms, hit: Boolean(t.hit), factors: {}, fromX: t.from_x, fromY: t.from_y, toX: t.to_x, toY: t.to_y,
    startX: t.start_x, startY: t.start_y, endX: t.end_x, endY: t.end_y,
  }));
  const result = analyzeTrials(rows, { start: "actual", exclude: "none" });
  const n = 13;
  // Expected TP per sequence = ID/MT with ID = log2(A/W + 1) (Shannon, MacKenzie 1992) and the
  // simulated MT; its sampling error comes from estimating SDx from n endpoints: SE(SDx)/SDx ≈
  // 1/√(2(n−1)) (normal-theory SE of a sample SD, from memory), which moves IDe by
  // (Ae/(Ae+We))/ln 2 bits per unit of ln We, plus 5 % timing noise per movement.
  for (const cell of result.cells) {
    const seqs = result.sequences.filter((s) => s.condition === cell.condition);
    expect(seqs).toHaveLength(2);
    const expected = seqs.map((s) => {
      const id = Math.log2(s.amplitude / s.width + 1);
      return id / ((INTERCEPT_MS + SLOPE_MS_PER_BIT * id) / 1000);
    });
    const meanExpected = expected.reduce((a, b) => a + b, 0) / expected.length;
    const se = Math.sqrt(seqs.reduce((acc, s, i) => {
      const ideSe = (s.amplitude / (s.amplitude + s.width) / Math.LN2) / Math.sqrt(2 * (n - 1));
      const tpSe = Math.hypot(ideSe / (s.mt / 1000), (expected[i]! * 0.05) / Math.sqrt(n));
      return acc + tpSe * tpSe;
    }, 0)) / seqs.length;
    expect(Math.abs(cell.tp - meanExpected), `${cell.condition}: TP ${cell.tp} vs expected ${meanExpected} ± ${se}`).toBeLessThan(3 * se);
  }
});

test("the study the session filled: its owner sees the results, exports the archive and downloads the consent register", async ({ page }) => {
  test.setTimeout(120_000);
  const owner = demo("researcher"); // the fixture's studies belong to the demo researcher
  await signInWithForm(page, owner.email, owner.password);
  await page.waitForURL(/\/studies/);
  await page.goto(`/studies/${fx.studyId}/results`);
  const tp = page.getByTestId("figure-tp");
  await expect(tp).toBeVisible({ timeout: 30_000 });
  for (const c of ["gain 2", "gain 3"]) await expect(tp.locator("svg")).toContainText(c);

  await page.getByLabel(/raw sensor streams/).check();
  const [posted] = await Promise.all([
    page.waitForResponse((r) => r.url().endsWith(`/api/studies/${fx.studyId}/exports`) && r.request().method() === "POST"),
    page.getByRole("button", { name: "Start export" }).click(),
  ]);
  const { export: job } = (await posted.json()) as { export: { id: number } };
  const row = page.getByTestId(`export-${job.id}`);
  await expect(row.getByText("done", { exact: true })).toBeVisible({ timeout: 45_000 });
  const [download] = await Promise.all([page.waitForEvent("download"), row.getByRole("link", { name: "Download" }).click()]);
  const files = await readZip(await download.path());
  // 2 conditions × 2 measured sequences × 13 movements; practice is not in trials.csv; one stream per sequence, practice too
  const trialLines = files.get("trials.csv")!.toString("utf8").trim().split("\n");
  expect(trialLines).toHaveLength(1 + 2 * 2 * 13);
  expect([...files.keys()].filter((n) => n.startsWith("streams/"))).toHaveLength(6);
  const p = fx.participants[0]!;
  for (const [name, bytes] of files) {
    const text = (name.endsWith(".gz") ? gunzipSync(bytes) : bytes).toString("utf8");
    for (const needle of [p.code, p.token, p.completionCode, "Alex Example", "alex@participant.example"]) expect(text.includes(needle), `${needle} in ${name}`).toBe(false);
  }

  await page.goto(`/studies/${fx.studyId}/consent`);
  const [register] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Consent register (CSV)" }).click()]);
  const csv = readFileSync(await register.path(), "utf8").trim().split("\n");
  expect(csv).toHaveLength(2);
  expect(csv[1]).toContain(p.code);
  expect(csv[1]).toContain(fx.consentHash);
  expect(csv[1]).toContain("Alex Example");
});
