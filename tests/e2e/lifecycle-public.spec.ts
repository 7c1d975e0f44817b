import { expect, request, test } from "@playwright/test";
import type { Knex } from "knex";
import { apiAsRole, baseURL } from "./helpers";
import { fixtureDb } from "./fixtures/session-study";
import { FOUR_GAINS, lifecycleStudy, participant, signedIn } from "./fixtures/lifecycle";

// The public link: a GET shows the information page and creates nothing (link previews, mail
// scanners); "Start" (a POST) creates one participant per browser; a panel's participant id passes
// through, encrypted, and the return address receives the completion code.

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

async function publicStudy(extra: Record<string, unknown>): Promise<{ studyId: number; link: string }> {
  const [researcher, reviewer] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const studyId = await lifecycleStudy(researcher, reviewer, FOUR_GAINS, "recruiting", { publicLink: true, ...extra });
  const state = (await (await researcher.get(`/api/studies/${studyId}/recruitment`)).json()) as { publicLink: string };
  await researcher.dispose();
  await reviewer.dispose();
  return { studyId, link: state.publicLink };
}

const count = async (studyId: number) => Number((await db("participants").where({ study_id: studyId }).count<{ n: number }[]>({ n: "*" }))[0]!.n);

test("a public link opened with a GET by a scanner creates nothing", async () => {
  const { studyId, link } = await publicStudy({});
  const scanner = await request.newContext({ baseURL, extraHTTPHeaders: { "user-agent": "LinkPreviewBot/1.0 (mail scanner)" } });
  for (let i = 0; i < 3; i++) {
    const res = await scanner.get(link);
    expect(res.status()).toBe(200);
    const page = await res.text();
    expect(page).toContain(">Start</button>");
    expect(page).toContain("by turning your own device. Repeated wrist rotation can strain"); // a motion study: the wrist caution
  }
  expect((await scanner.head(link)).status()).toBe(200);
  expect((await scanner.get(link.replace("/s/public/", "/api/public/"))).status()).toBe(405); // following the form's action with a GET
  expect(await count(studyId)).toBe(0);
  await scanner.dispose();
});

test("a panel id passes through and the return address gets the completion code", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const { studyId, link } = await publicStudy({ panelParam: "pid", returnUrlComplete: `${baseURL}/api/health?done={code}&pid={panel_id}` });
  const panelId = `PANEL-${Date.now()}`;
  await page.goto(`${link}?pid=${panelId}`);
  await page.getByRole("button", { name: "Start" }).click();
  await expect(page).toHaveURL(/\/s\/[A-Za-z0-9_-]{22}$/);
  const token = new URL(page.url()).pathname.split("/").pop()!;
  // a second click on the link in the same browser resumes, and creates nobody new
  await page.goto(`${link}?pid=${panelId}`);
  await page.getByRole("link", { name: "Continue where you left off" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${token}$`));
  expect(await count(studyId)).toBe(1);
  const row = await db("participants").where({ study_id: studyId }).first<{ panel_id_encrypted: string; source: string }>();
  expect(row!.source).toBe("public");
  expect(row!.panel_id_encrypted).not.toContain(panelId);

  const p = await participant(token);
  expect(await p.consent()).toBe(201);
  await p.device("ok");
  await p.start();
  const code = await p.finish();
  await p.dispose();
  await page.reload();
  await expect(page.getByTestId("completion-code")).toHaveText(code);
  await page.getByTestId("complete-return").click();
  await expect(page).toHaveURL(`${baseURL}/api/health?done=${encodeURIComponent(code)}&pid=${panelId}`);

  // the owner alone sees the panel id, to match payments
  const owner = await signedIn(await (await browser.newContext()).newPage(), "researcher");
  await owner.goto(`/studies/${studyId}/participants`);
  await expect(owner.getByRole("table", { name: "Participants" })).toContainText(panelId);
});
