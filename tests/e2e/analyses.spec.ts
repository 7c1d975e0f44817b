import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { expect, test } from "@playwright/test";
import { apiAs, apiAsRole, demo, signInWithForm } from "./helpers";

const fixture = (name: string) => `tests/fixtures/analysis/${name}`;

test("a researcher uploads a trial table in the page and sees the same analysis the CLI prints", async ({ page }) => {
  const who = demo("researcher");
  await signInWithForm(page, who.email, who.password);
  await page.getByRole("link", { name: "Analyse a trial table" }).click();
  await page.getByLabel("Trial table (CSV, up to 100 MB)").setInputFiles(fixture("good.csv"));
  await page.getByLabel("Start point S").selectOption("nominal");
  await page.getByRole("button", { name: "Upload and analyse" }).click();
  await expect(page).toHaveURL(/\/analyses\/\d+$/);
  await expect(page.getByRole("heading", { name: "good.csv" })).toBeVisible();
  await expect(page.getByRole("heading", { name: /Conditions/ })).toBeVisible();

  // The upload API and the analyze CLI give the same JSON for the same file and options.
  const id = Number(page.url().split("/").at(-1));
  const api = await apiAs(who.email, who.password);
  const stored = (await (await api.get(`/api/analyses/${id}`)).json()) as { result: Record<string, unknown>; options: { start: string } };
  expect(stored.options.start).toBe("nominal");
  const cli = JSON.parse(execFileSync("npx", ["tsx", "experiments/cli/analyze.ts", fixture("good.csv"), "--json", "--start", "nominal"], { encoding: "utf8" })) as Record<string, unknown>;
  for (const key of ["unit", "start", "exclude", "excluded", "sequences", "cells", "conditions", "regression", "anova", "posthoc"]) {
    expect(stored.result[key], key).toEqual(cli[key]);
  }
  for (const row of cli.conditions as { condition: string }[]) await expect(page.getByRole("cell", { name: row.condition, exact: true }).first()).toBeVisible();
});

test("bad trial tables answer 422 naming file, line and column; nothing is stored", async () => {
  const api = await apiAsRole("researcher");
  const before = ((await (await api.get("/api/analyses")).json()) as { imports: unknown[] }).imports.length;
  for (const name of ["not-a-number.csv", "missing-column.csv", "empty.csv", "short-sequence.csv", "zero-width.csv"]) {
    const res = await api.post("/api/analyses", { multipart: { file: { name, mimeType: "text/csv", buffer: readFileSync(fixture(name)) } } });
    expect(res.status(), name).toBe(422);
    const body = (await res.json()) as { error: { message: string } };
    expect(body.error.message, name).toMatch(new RegExp(`^${name.replace(".", "\\.")}:\\d+:[^:]+: `));
    expect(body.error.message.split("\n")).toHaveLength(1);
  }
  const notMultipart = await api.post("/api/analyses", { headers: { "content-type": "text/csv" }, data: readFileSync(fixture("good.csv")) });
  expect(notMultipart.status()).toBe(415);
  const huge = await api.post("/api/analyses", { multipart: { file: { name: "huge.csv", mimeType: "text/csv", buffer: Buffer.alloc(101 * 1024 * 1024, 0x41) } } });
  expect(huge.status()).toBe(413);
  expect(((await (await api.get("/api/analyses")).json()) as { imports: unknown[] }).imports).toHaveLength(before);
});
