import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import { changeUser } from "@/lib/accounts/users";
import type { SessionUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchSessionByToken, recordConsent } from "@/lib/data/participants";
import { assertStudyTeam } from "@/lib/data/results";
import { addTeamMember, insertStudy } from "@/lib/data/studies";
import { insertUser } from "@/lib/data/users";
import { CONSENT_COPY_ADDRESS_LIMIT, sendConsentCopy } from "@/lib/mail/consentCopy";
import { createSessionStudy, motionDesign } from "../e2e/fixtures/session-study";

const asUser = async (email: string): Promise<SessionUser> => {
  const row = await db("users").where({ email }).first();
  return { id: row.id, email: row.email, name: row.name, role: row.role };
};

beforeAll(async () => {
  await seedDemo(db);
});
afterAll(() => db.destroy());

describe("a researcher who becomes a reviewer", () => {
  it("leaves every study team, so results and exports are closed to them; an owner's role cannot change", async () => {
    const admin = await asUser("admin@harbourview-lab.example");
    const owner = await asUser("tomas@harbourview-lab.example");
    const id = await insertUser(db, { email: `moving.${Date.now()}@harbourview-lab.example`, name: "Moving Person", role: "researcher", passwordHash: null });
    const studyId = await insertStudy(db, { title: `Team change ${Date.now()}`, summary: "s", protocolNumber: null, ownerId: owner.id });
    await db("studies").where({ id: studyId }).update({ status: "approved" });
    await addTeamMember(db, studyId, id, "editor");
    await changeUser(db, admin, id, { role: "reviewer", active: true });
    expect(await db("study_members").where({ user_id: id }).count({ n: "*" })).toEqual([{ n: 0 }]);
    const asReviewer = { id, email: "moving@x", name: "Moving Person", role: "reviewer" as const };
    await expect(assertStudyTeam(db, asReviewer, studyId)).rejects.toMatchObject({ status: 403 });
    // even a membership left behind by hand counts for nothing once the role is not researcher
    await db("study_members").insert({ study_id: studyId, user_id: id, role: "editor" });
    await expect(assertStudyTeam(db, asReviewer, studyId)).rejects.toMatchObject({ status: 403 });
    await expect(changeUser(db, admin, owner.id, { role: "reviewer", active: true })).rejects.toMatchObject({ status: 409 });
    const audit = await db("audit_log").where({ action: "user.change" }).orderBy("id", "desc").first();
    expect(typeof audit.details === "string" ? JSON.parse(audit.details) : audit.details).toMatchObject({ userId: id, previousRole: "researcher", membershipsRemoved: 1 });
  });
});

describe("the consent copy", () => {
  it("goes out once per participant, and a few times per client address", async () => {
    const fx = await createSessionStudy(db, "Consent copy limit", motionDesign, CONSENT_COPY_ADDRESS_LIMIT.max + 2);
    const outcomes: boolean[] = [];
    for (const [i, p] of fx.participants.entries()) {
      const ctx = (await fetchSessionByToken(db, p.token))!;
      const signed = await recordConsent(db, ctx, { consentVersionId: fx.consentVersionId, versionHash: fx.consentHash, agreed: ["s1", "s2", "s3"], typedName: "Sam Example", screenShortSidePx: 700 }, null);
      outcomes.push(await sendConsentCopy(db, ctx, `stranger${i}@mailbox.example`, "198.51.100.200", signed, "http://x.example/s/t"));
      if (i === 0) expect(await sendConsentCopy(db, ctx, "another.stranger@mailbox.example", "198.51.100.201", signed, "http://x.example/s/t")).toBe(false);
    }
    expect(outcomes.filter(Boolean)).toHaveLength(CONSENT_COPY_ADDRESS_LIMIT.max);
    const logged = await db("outgoing_mail").where({ template: "consent-copy" }).whereIn("participant_id", fx.participants.map((p) => p.id)).select("to_address");
    expect(logged.every((r: { to_address: string | null }) => r.to_address === null)).toBe(true);
  });
});
