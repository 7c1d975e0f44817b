import { expect, request, test } from "@playwright/test";
import type { Knex } from "knex";
import { apiAsRole, baseURL } from "./helpers";
import { fixtureDb } from "./fixtures/session-study";
import { FOUR_GAINS, lifecycleStudy } from "./fixtures/lifecycle";

// Attack: flooding the audit log without signing in. The requests anyone can make that write an
// entry are a public link's Start (a participant and "invitation.public_visit"), a password-reset
// request ("user.reset_requested", only for an existing account) and a sign-in (only a successful
// one is logged). Each flood below must grow the log by a fixed bound, whatever the client
// claims in X-Forwarded-For (the server trusts no forwarded hop unless configured).
// Counted by action and study or account, so other specs writing the log meanwhile do not matter.

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

const entries = async (where: Record<string, unknown>) => Number((await db("audit_log").where(where).count<{ n: number }[]>({ n: "*" }))[0]!.n);
const unique = () => `${Date.now()}${Math.floor(Math.random() * 1e6)}`;

test("120 cookie-less Starts on a public link from one address, each claiming another, add at most 30 participants and entries", async () => {
  test.setTimeout(120_000);
  const [researcher, reviewer] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const studyId = await lifecycleStudy(researcher, reviewer, FOUR_GAINS, "recruiting", { publicLink: true });
  const { publicLink } = (await (await researcher.get(`/api/studies/${studyId}/recruitment`)).json()) as { publicLink: string };
  await researcher.dispose();
  await reviewer.dispose();
  const action = publicLink.replace("/s/public/", "/api/public/");
  const before = await entries({ study_id: studyId, action: "invitation.public_visit" });
  const statuses: number[] = [];
  for (let round = 0; round < 6; round++) {
    // a fresh client each time: no visitor cookie to resume with
    const clients = await Promise.all(Array.from({ length: 20 }, () => request.newContext({ baseURL })));
    statuses.push(...(await Promise.all(clients.map((c, i) => c.post(action, {
      form: { panel_id: "" }, maxRedirects: 0, headers: { "x-forwarded-for": `198.51.100.${round * 20 + i + 1}` },
    }).then((r) => r.status())))));
    for (const c of clients) await c.dispose();
  }
  const started = statuses.filter((s) => s === 303).length;
  expect(started).toBeLessThanOrEqual(30);
  expect(started).toBeGreaterThan(0); // the limit is not a closed door
  expect(statuses.filter((s) => s !== 303).every((s) => s === 429)).toBe(true);
  expect((await entries({ study_id: studyId, action: "invitation.public_visit" })) - before).toBe(started);
  expect(Number((await db("participants").where({ study_id: studyId }).count<{ n: number }[]>({ n: "*" }))[0]!.n)).toBe(started);
});

test("8 reset requests for one account add at most 3 entries; 40 wrong passwords add none", async ({ browser }) => {
  test.setTimeout(180_000);
  const admin = await apiAsRole("admin");
  const email = `flood.${unique()}@harbourview-lab.example`;
  const made = await admin.post("/api/admin/users", { data: { email, name: "Flood Target", role: "researcher" } });
  expect(made.status()).toBe(201);
  await admin.dispose();
  const id = (await db("users").where({ email }).first<{ id: number }>("id"))!.id;
  const before = await entries({ actor_user_id: id });

  // the reset form, as a person (or a script driving a browser) submits it, from changing claimed addresses
  for (let i = 0; i < 8; i++) {
    const context = await browser.newContext({ baseURL, extraHTTPHeaders: { "x-forwarded-for": `203.0.113.${i + 1}` } });
    const page = await context.newPage();
    await page.goto("/reset");
    await page.getByLabel("E-mail").fill(email);
    await page.getByRole("button", { name: "Send the link" }).click();
    await expect(page.getByRole("status")).toContainText("on its way"); // the same words every time
    await context.close();
  }
  const clients = await Promise.all(Array.from({ length: 20 }, () => request.newContext({ baseURL })));
  await Promise.all(clients.map(async (c, i) => {
    const { csrfToken } = (await (await c.get("/api/auth/csrf")).json()) as { csrfToken: string };
    await c.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: `wrong-${i}`, json: "true" }, headers: { "x-forwarded-for": `192.0.2.${i + 1}` } });
    await c.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: `wrong-again-${i}`, json: "true" } });
  }));
  for (const c of clients) await c.dispose();
  // the reset's own work runs after the answer: give it a moment to land before counting
  await expect.poll(() => entries({ actor_user_id: id, action: "user.reset_requested" }), { timeout: 10_000 }).toBeGreaterThan(0);
  await new Promise((r) => setTimeout(r, 1000));
  expect((await entries({ actor_user_id: id })) - before).toBeLessThanOrEqual(3);
  expect(await entries({ actor_user_id: id, action: "user.sign_in" })).toBe(0);
});
