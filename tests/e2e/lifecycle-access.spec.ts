import { expect, request, test } from "@playwright/test";
import { apiAs, apiAsRole, baseURL } from "./helpers";
import { FOUR_GAINS, lifecycleStudy, links, participant } from "./fixtures/lifecycle";

// The role matrix of the lifecycle's pages (the API routes are in tests/e2e/matrix/lifecycle.ts):
// the participants page, a participant's page, recruitment and the live monitor show participant
// codes, so only the study's team sees them; within the team, erasure is the owner's and
// exclusions the editors'. Others get nothing of the page: a sign-in, their own home, or a 404.

const PRIYA = { email: "priya@harbourview-lab.example", password: "demo-research-priya" }; // a demo researcher, not on the study at first

test("the lifecycle's pages show participants to the study's team alone, with erasure for the owner only", async ({ browser }) => {
  test.setTimeout(120_000);
  const [owner, reviewer] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const studyId = await lifecycleStudy(owner, reviewer, FOUR_GAINS, "recruiting");
  const [who] = await links(owner, studyId, 1);
  const p = await participant(who!.token);
  expect(await p.consent()).toBe(201);
  await p.dispose();
  const listed = (await (await owner.get(`/api/studies/${studyId}/invitations`)).json()) as { invitations: { participantId: number; code: string }[] };
  const pid = listed.invitations.find((i) => i.code === who!.code)!.participantId;
  const pages = [`/studies/${studyId}/participants`, `/studies/${studyId}/participants/${pid}`, `/studies/${studyId}/recruitment`, `/studies/${studyId}/monitor`];

  const anonymous = await request.newContext({ baseURL });
  const outsider = await apiAs(PRIYA.email, PRIYA.password);
  const outsiderPage = await (await browser.newContext({ storageState: await outsider.storageState() })).newPage();
  for (const path of pages) {
    const own = await owner.get(path);
    expect(own.status(), path).toBe(200);
    expect(await own.text(), path).toContain(who!.code);

    const anon = await anonymous.get(path);
    expect(new URL(anon.url()).pathname, path).toBe("/signin");
    expect(await anon.text(), path).not.toContain(who!.code);

    const rev = await reviewer.get(path);
    expect(new URL(rev.url()).pathname, path).toBe("/review"); // the reviewer's own area, never the team's pages
    expect(await rev.text(), path).not.toContain(who!.code);

    // a researcher outside the team: not one byte with the code (the not-found page streams after the area's loading state, so the status may be 200)
    expect(await (await outsider.get(path)).text(), path).not.toContain(who!.code);
    await outsiderPage.goto(path);
    await expect(outsiderPage.getByRole("heading", { name: "Not found" }), path).toBeVisible();
  }

  // on the team as a viewer: the participants, without erasure or exclusion controls
  expect((await owner.post(`/api/studies/${studyId}/team`, { data: { email: PRIYA.email, role: "viewer" } })).status()).toBe(200);
  const asViewer = await (await outsider.get(`/studies/${studyId}/participants`)).text();
  expect(asViewer).toContain(who!.code);
  expect(asViewer).not.toContain("Erase a participant");
  expect(asViewer).not.toContain("Exclude…");
  expect(await (await owner.get(`/studies/${studyId}/participants`)).text()).toContain("Erase a participant");
  // as an editor: exclusions, still no erasure (the owner's alone)
  expect((await owner.post(`/api/studies/${studyId}/team`, { data: { email: PRIYA.email, role: "editor" } })).status()).toBe(200);
  const asEditor = await (await outsider.get(`/studies/${studyId}/participants`)).text();
  expect(asEditor).toContain("Exclude…");
  expect(asEditor).not.toContain("Erase a participant");
  for (const c of [owner, reviewer, anonymous, outsider]) await c.dispose();
});
