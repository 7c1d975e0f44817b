import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import type { SessionUser } from "@/lib/auth/guards";
import { sha256Text } from "@/lib/consent/sha256Text";
import { db } from "@/lib/db";
import { insertStudy } from "@/lib/data/studies";
import { changeRecruitment } from "@/lib/recruitment/service";
import { saveConsentDraft } from "@/lib/study/service/consent";
import { saveDesign } from "@/lib/study/service/design";
import { decideReview, submitForReview } from "@/lib/study/service/review";

// Finding: the frozen consent text could differ from its fingerprint (a save racing the
// submission), and recruitment's status was read earlier and written later. Each race is run
// many times in parallel against MariaDB; the fingerprint is SHA-256 of the stored UTF-8 text
// (FIPS 180-4 via node:crypto, sha256Text).

const DESIGN = {
  factors: [{ name: "gain", levels: [{ label: "gain 3", config: { gain: 3 } }, { label: "gain 6", config: { gain: 6 } }] }],
  task: { amplitudes: [20], widths: [4] },
  counterbalancing: { method: "williams", seed: 1 },
};
const text = (k: number) => `## Purpose\nAiming study, text ${k}. About 20 minutes.\n## Risks\nWrist strain, motion sickness.\n`;

let owner: SessionUser, reviewer: SessionUser;
const asUser = async (email: string): Promise<SessionUser> => {
  const r = await db("users").where({ email }).first();
  return { id: r.id, email: r.email, name: r.name, role: r.role };
};

beforeAll(async () => {
  await seedDemo(db);
  owner = await asUser("tomas@harbourview-lab.example");
  reviewer = await asUser("ethics@harbourview-lab.example");
});
afterAll(() => db.destroy());

async function draftStudy(k: number): Promise<number> {
  const id = await insertStudy(db, { title: `Race ${k} ${Date.now()}`, summary: "s", protocolNumber: null, ownerId: owner.id });
  await saveDesign(db, owner, id, DESIGN);
  await saveConsentDraft(db, owner, id, { body: text(0) });
  return id;
}
const settle = (p: Promise<unknown>) => p.then(() => "ok", (e: { status?: number }) => e.status ?? e);

describe("the consent text frozen by a submission", () => {
  it("attack: saves racing the submission (100 studies at once) never leave a frozen text whose fingerprint is another text's", async () => {
    const studies = await Promise.all(Array.from({ length: 100 }, (_, k) => draftStudy(k)));
    // the submission first, the saves a few milliseconds later (spread over its reads and its transaction)
    const later = (ms: number, f: () => Promise<unknown>) => new Promise((r) => setTimeout(r, ms)).then(f);
    const outcomes = await Promise.all(studies.map((id, k) => Promise.all([
      settle(submitForReview(db, owner, id)),
      settle(later(k % 8, () => saveConsentDraft(db, owner, id, { body: text(k + 1000) }))),
      settle(later((k * 3) % 11, () => saveConsentDraft(db, owner, id, { body: text(k + 2000) }))),
      settle(later((k * 5) % 13, () => saveDesign(db, owner, id, { ...DESIGN, task: { amplitudes: [30], widths: [4] } }))),
    ])));
    // every refusal is a conflict (409), never an error
    expect(outcomes.flat().every((o) => o === "ok" || o === 409)).toBe(true);
    const frozen = await db("consent_versions").whereIn("study_id", studies).whereNot({ status: "draft" }).select<{ body_md: string; sha256: string }[]>("body_md", "sha256");
    expect(frozen.length).toBe(outcomes.filter((o) => o[0] === "ok").length);
    for (const v of frozen) expect(v.sha256).toBe(sha256Text(v.body_md));
    // and what was submitted for review is the design as it was frozen (no save after the submission)
    const reviews = await db("study_reviews as r").join("studies as s", "s.id", "r.study_id").whereIn("r.study_id", studies).select<{ rh: string; sh: string }[]>("r.design_hash as rh", "s.design_hash as sh");
    for (const r of reviews) expect(r.rh).toBe(r.sh);
  });

  it("attack: a save that commits after the submission read the text (forced order) is frozen with its own fingerprint", async () => {
    const id = await draftStudy(7777);
    const holder = await db.transaction();
    await holder("studies").where({ id }).forUpdate().first("id"); // the submission's reads run, its transaction waits here
    const submitted = submitForReview(db, owner, id);
    await new Promise((r) => setTimeout(r, 400));
    // a save of the draft lands now (as an unlocked save could) and commits before the freeze
    await holder("consent_versions").where({ study_id: id, status: "draft" }).update({ body_md: text(4242) });
    await holder.commit();
    await submitted;
    const v = await db("consent_versions").where({ study_id: id }).first<{ body_md: string; sha256: string; status: string }>("body_md", "sha256", "status");
    expect(v.status).toBe("submitted");
    expect(v.body_md).toBe(text(4242));
    expect(v.sha256).toBe(sha256Text(text(4242)));
  });

  it("a design saved after the submission read it (forced order) makes the submission refuse (409) rather than freeze an older design", async () => {
    const id = await draftStudy(7778);
    const holder = await db.transaction();
    await holder("studies").where({ id }).forUpdate().first("id");
    const submitted = settle(submitForReview(db, owner, id));
    await new Promise((r) => setTimeout(r, 400));
    await holder("studies").where({ id }).update({ design_hash: "0".repeat(64) });
    await holder.commit();
    expect(await submitted).toBe(409);
    expect(await db("study_reviews").where({ study_id: id }).count({ n: "*" })).toEqual([{ n: 0 }]);
  });
});

describe("opening recruitment", () => {
  it("attack: 100 parallel opens and closes of an approved study: one opens, the rest are refused with 409, and one entry is logged", async () => {
    const id = await draftStudy(9999);
    await submitForReview(db, owner, id);
    await decideReview(db, reviewer, id, { decision: "approve", comment: "" });
    const outcomes = await Promise.all(Array.from({ length: 100 }, () => settle(changeRecruitment(db, owner, id, { action: "open" }))));
    expect(outcomes.filter((o) => o === "ok")).toHaveLength(1);
    expect(outcomes.filter((o) => o === 409)).toHaveLength(99);
    expect(await db("audit_log").where({ study_id: id, action: "recruitment.open" }).count({ n: "*" })).toEqual([{ n: 1 }]);
    const closes = await Promise.all(Array.from({ length: 100 }, () => settle(changeRecruitment(db, owner, id, { action: "close" }))));
    expect(closes.filter((o) => o === "ok")).toHaveLength(1);
    expect((await db("studies").where({ id }).first()).status).toBe("closed");
  });

  it("a study whose submission is still in review cannot be opened, however many ask at once", async () => {
    const id = await draftStudy(9998);
    await submitForReview(db, owner, id);
    const outcomes = await Promise.all(Array.from({ length: 20 }, () => settle(changeRecruitment(db, owner, id, { action: "open" }))));
    expect(outcomes.every((o) => o === 409)).toBe(true);
    expect((await db("studies").where({ id }).first()).status).toBe("in_review");
  });
});
