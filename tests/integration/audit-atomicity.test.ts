import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seeds/demo";
import { consumePasswordToken, issuePasswordToken } from "@/lib/accounts/password-tokens";
import { inviteUser } from "@/lib/accounts/users";
import { hashPassword } from "@/lib/auth/password";
import type { SessionUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchAuditHead, GENESIS_HASH } from "@/lib/data/audit";
import { consentForSession, fetchSessionByToken, recordConsent } from "@/lib/data/participants";
import { startTasks } from "@/lib/data/places";
import { insertStudy } from "@/lib/data/studies";
import { insertUser } from "@/lib/data/users";
import { changeRecruitment, createInvitations, visitPublicLink } from "@/lib/recruitment/service";
import { cloneStudy } from "@/lib/study/service/clone";
import { saveConsentDraft } from "@/lib/study/service/consent";
import { saveDesign } from "@/lib/study/service/design";
import { setTeamMember, updateStudyMeta } from "@/lib/study/service/meta";
import { decideReview, submitForReview } from "@/lib/study/service/review";
import type { StudyDesignInput } from "@/lib/study/design";
import { ownerDb } from "./ownerDb";

// Finding: an action could commit without its audit entry, because the entry was appended after
// the action's transaction had committed (a lock timeout or a lost connection in between left the
// action unrecorded). The attack: make the audit append fail (its head row gone, as any failure
// of the append would) and run each consequential action; each must fail and leave nothing of
// itself behind. Before the fix, submitForReview, decideReview, updateStudyMeta, setTeamMember,
// cloneStudy, startTasks, visitPublicLink, inviteUser and the password reset all committed.

const owner_ = ownerDb();
let owner: SessionUser, reviewer: SessionUser, colleague: SessionUser, admin: SessionUser;
const asUser = async (email: string): Promise<SessionUser> => {
  const r = await db("users").where({ email }).first();
  return { id: r.id, email: r.email, name: r.name, role: r.role };
};

const DESIGN: StudyDesignInput = {
  baseConfig: { technique: "motion", displayMode: "cursor", pixelsPerDegree: 10 },
  factors: [{ name: "gain", levels: [1, 2].map((g) => ({ label: `gain ${g}`, config: { gain: g } })) }],
  task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [300], widths: [30], targetsPerRing: 5, sequencesPerAW: 1, practiceSequences: 0, selection: "tap" },
  minBreakSeconds: 0,
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 4,
  eraseOnWithdrawal: false,
};
const CONSENT = "## Purpose\nAiming study. About 10 minutes.\n## Risks\nWrist strain and motion sickness: stop at any time.\n";

beforeAll(async () => {
  await seedDemo(db);
  owner = await asUser("tomas@harbourview-lab.example");
  colleague = await asUser("priya@harbourview-lab.example");
  reviewer = await asUser("ethics@harbourview-lab.example");
  admin = await asUser("admin@harbourview-lab.example");
});
afterEach(restoreHead);
afterAll(async () => {
  await owner_.destroy();
  await db.destroy();
});

/** The head row as it was, so the chain goes on where it stood (saved by breakAudit). */
let saved: { last_id: number; hash: string; entries: number } | null = null;
async function breakAudit(): Promise<void> {
  saved = await owner_("audit_head").where({ id: 1 }).first("last_id", "hash", "entries");
  await owner_("audit_head").where({ id: 1 }).delete();
}
async function restoreHead(): Promise<void> {
  if (!saved) return;
  await owner_("audit_head").insert({ id: 1, ...saved });
  saved = null;
}
const entries = async () => Number((await owner_("audit_log").count({ n: "*" }))[0]!.n);

async function draftStudy(): Promise<number> {
  const id = await insertStudy(db, { title: `Atomic ${Date.now()} ${Math.random()}`, summary: "s", protocolNumber: null, ownerId: owner.id });
  await saveDesign(db, owner, id, DESIGN);
  await saveConsentDraft(db, owner, id, { body: CONSENT });
  return id;
}
async function recruiting(publicLink = false): Promise<{ id: number; link: string | null }> {
  const id = await draftStudy();
  await submitForReview(db, owner, id);
  await decideReview(db, reviewer, id, { decision: "approve" });
  const state = await changeRecruitment(db, owner, id, { action: "open", ...(publicLink ? { publicLink: true } : {}) });
  return { id, link: state.publicLink };
}

describe("an action whose audit entry cannot be written does not happen", () => {
  it("submitting for review and deciding on it", async () => {
    const id = await draftStudy();
    const before = await entries();
    await breakAudit();
    await expect(submitForReview(db, owner, id)).rejects.toThrow(/audit head/);
    await restoreHead();
    expect(await db("studies").where({ id }).first("status")).toEqual({ status: "draft" });
    expect(await db("study_reviews").where({ study_id: id }).count({ n: "*" })).toEqual([{ n: 0 }]);
    expect(await db("consent_versions").where({ study_id: id }).pluck("status")).toEqual(["draft"]);
    expect(await entries()).toBe(before);

    await submitForReview(db, owner, id); // works again with the head back
    await breakAudit();
    await expect(decideReview(db, reviewer, id, { decision: "approve" })).rejects.toThrow(/audit head/);
    await restoreHead();
    expect(await db("studies").where({ id }).first("status")).toEqual({ status: "in_review" });
    expect(await db("study_reviews").where({ study_id: id }).pluck("status")).toEqual(["submitted"]);
    expect(await db("consent_versions").where({ study_id: id }).pluck("status")).toEqual(["submitted"]);
  });

  it("editing the participant information, the team, and cloning", async () => {
    const id = await draftStudy();
    const title = (await db("studies").where({ id }).first<{ title: string }>("title")).title;
    const studies = async () => Number((await db("studies").where({ owner_id: owner.id }).count({ n: "*" }))[0]!.n);
    const count = await studies();
    await breakAudit();
    await expect(updateStudyMeta(db, owner, id, { title: "Changed without a trace", summary: "s", protocolNumber: null })).rejects.toThrow(/audit head/);
    await expect(setTeamMember(db, owner, id, { email: colleague.email, role: "editor" })).rejects.toThrow(/audit head/);
    await expect(cloneStudy(db, owner, id)).rejects.toThrow(/audit head/);
    await restoreHead();
    expect(await db("studies").where({ id }).first("title")).toEqual({ title });
    expect(await db("study_members").where({ study_id: id, user_id: colleague.id }).first()).toBeUndefined();
    expect(await studies()).toBe(count);
  });

  it("a participant starting the tasks, and a visitor starting through the public link", async () => {
    const { id, link } = await recruiting(true);
    const [invited] = await createInvitations(db, owner, id, { mode: "links", count: 1 });
    const ctx = (await fetchSessionByToken(db, invited!.token))!;
    const v = (await consentForSession(db, ctx))!;
    await recordConsent(db, ctx, { consentVersionId: v.id, versionHash: v.sha256!, agreed: ["s1"], screenShortSidePx: 400 }, null);
    const consented = (await fetchSessionByToken(db, invited!.token))!;
    const participants = async () => Number((await db("participants").where({ study_id: id }).count({ n: "*" }))[0]!.n);
    const count = await participants();
    await breakAudit();
    await expect(startTasks(db, consented)).rejects.toThrow(/audit head/);
    await expect(visitPublicLink(db, link!.split("/s/public/")[1]!)).rejects.toThrow(/audit head/);
    await restoreHead();
    const row = await db("participants").where({ id: invited!.id }).first<{ status: string; condition_order: unknown; cb_slot: number | null }>("status", "condition_order", "cb_slot");
    expect(row).toEqual({ status: "consented", condition_order: null, cb_slot: null });
    expect(await participants()).toBe(count);
  });

  it("inviting an account, and setting a password with a reset link", async () => {
    const email = `atomic-${Date.now()}@harbourview-lab.example`;
    await breakAudit();
    await expect(inviteUser(db, admin, { email, name: "Atomic Person", role: "researcher" })).rejects.toThrow(/audit head/);
    await restoreHead();
    expect(await db("users").where({ email }).first()).toBeUndefined();
    expect(await db("outgoing_mail").where({ template: "invite" }).andWhere("created_at", ">=", new Date(Date.now() - 10_000)).first()).toBeUndefined();

    // an account of this test's own (the demo's people keep their passwords for other tests)
    const someone = await insertUser(db, { email: `reset-${Date.now()}@harbourview-lab.example`, name: "Reset Person", role: "researcher", passwordHash: await hashPassword("the-old-password-1") });
    const token = await issuePasswordToken(db, someone, "reset");
    const hash = (await db("users").where({ id: someone }).first<{ password_hash: string }>("password_hash")).password_hash;
    await breakAudit();
    await expect(consumePasswordToken(db, token, "a-password-never-set-1")).rejects.toThrow(/audit head/);
    await restoreHead();
    expect((await db("users").where({ id: someone }).first<{ password_hash: string }>("password_hash")).password_hash).toBe(hash);
    expect(await consumePasswordToken(db, token, "a-password-set-now-2")).toBe(someone); // the token was not used up
  });

  it("the chain stays whole across the refused actions", async () => {
    const head = await fetchAuditHead(db);
    expect(head.hash).not.toBe(GENESIS_HASH);
    const { verifyAuditChain } = await import("@/lib/data/audit");
    expect(await verifyAuditChain(db)).toMatchObject({ intact: true });
  });
});
