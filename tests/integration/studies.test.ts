import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { seedDemo } from "@/db/seeds/demo";
import { verifyAuditChain } from "@/lib/data/audit";
import { ownerDb } from "./ownerDb";
import { hashToken } from "@/lib/auth/tokens";
import type { SessionUser } from "@/lib/auth/guards";
import { sha256Text } from "@/lib/consent/sha256Text";
import { insertStudy } from "@/lib/data/studies";
import { openWithDataKey } from "@/lib/recruitment/dataKey";
import { changeRecruitment, createInvitations, insertParticipant, recruitmentBlocker, visitPublicLink } from "@/lib/recruitment/service";
import { saveConsentDraft } from "@/lib/study/service/consent";
import { saveDesign } from "@/lib/study/service/design";
import { setTeamMember } from "@/lib/study/service/meta";
import { decideReview, submitForReview } from "@/lib/study/service/review";
import { fetchInForceVersion, pendingAmendment } from "@/lib/study/service/protocol";
import { fetchStudiesInReview } from "@/lib/data/studies";
import { localStore } from "@/lib/storage/localStore";
import { readDocument, saveDocument } from "@/lib/storage/documents";
import { mkdtemp, readdir } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";

const DESIGN = {
  factors: [
    { name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }, { label: "stick", config: { technique: "stick" } }] },
    { name: "gain", levels: [{ label: "gain 3", config: { gain: 3 } }, { label: "gain 6", config: { gain: 6 } }] },
  ],
  task: { amplitudes: [20, 40], widths: [2, 4] },
  counterbalancing: { method: "williams", seed: 1 },
};
const CONSENT = "## Purpose\nAiming study. About 20 minutes.\n## Risks\nWrist strain, motion sickness, flashing.\nContact: lab@harbourview-lab.example\n";

let owner: SessionUser, editor: SessionUser, viewer: SessionUser, outsider: SessionUser, reviewer: SessionUser, admin: SessionUser;

async function user(email: string): Promise<SessionUser> {
  const r = await db("users").where({ email }).first();
  return { id: r.id, email: r.email, name: r.name, role: r.role };
}

beforeAll(async () => {
  await seedDemo(db);
  owner = await user("tomas@harbourview-lab.example");
  editor = await user("priya@harbourview-lab.example");
  reviewer = await user("ethics@harbourview-lab.example");
  admin = await user("admin@harbourview-lab.example");
  const [vid] = await db("users").insert({ email: `viewer.${Date.now()}@harbourview-lab.example`, name: "Vera Viewer", role: "researcher" });
  viewer = await user((await db("users").where({ id: vid }).first()).email);
  const [oid] = await db("users").insert({ email: `outsider.${Date.now()}@harbourview-lab.example`, name: "Otto Outside", role: "researcher" });
  outsider = await user((await db("users").where({ id: oid }).first()).email);
});
afterAll(() => db.destroy());

async function newStudy(): Promise<number> {
  const id = await insertStudy(db, { title: `It study ${Date.now()}`, summary: "", protocolNumber: null, ownerId: owner.id });
  await setTeamMember(db, owner, id, { email: editor.email, role: "editor" });
  await setTeamMember(db, owner, id, { email: viewer.email, role: "viewer" });
  return id;
}

/** The HTTP status the route wrapper (lib/api/respond.ts) would answer: AppError's own, ZodError 422. */
const status = async (p: Promise<unknown>) => p.then(() => 200, (e: { status?: number; name?: string }) => e.status ?? (e.name === "ZodError" ? 422 : 500));

describe("team roles on every write (owner / editor / viewer, checked on the server)", () => {
  it("design and consent: owner and editor may write; viewer, outsider, reviewer, admin, anonymous may not", async () => {
    const id = await newStudy();
    expect(await status(saveDesign(db, owner, id, DESIGN))).toBe(200);
    expect(await status(saveDesign(db, editor, id, DESIGN))).toBe(200);
    for (const [who, code] of [[viewer, 403], [outsider, 403], [reviewer, 403], [admin, 403], [null, 401]] as const) {
      expect(await status(saveDesign(db, who, id, DESIGN))).toBe(code);
      expect(await status(saveConsentDraft(db, who, id, { body: CONSENT }))).toBe(code);
      expect(await status(submitForReview(db, who, id))).toBe(code);
    }
    expect(await status(setTeamMember(db, editor, id, { email: outsider.email, role: "viewer" }))).toBe(403); // owner only
    expect(await status(changeRecruitment(db, editor, id, { action: "settings", participantCap: 3 }))).toBe(403); // owner only
  });

  it("invalid designs are refused with the field's path: even ring, W ≥ A, duplicate and empty levels, no conditions", async () => {
    const id = await newStudy();
    const issues = async (d: unknown) => saveDesign(db, owner, id, d).then(() => [], (e: { issues: { path: PropertyKey[]; message: string }[] }) => e.issues.map((i) => `${i.path.join(".")}: ${i.message}`));
    expect(await issues({ ...DESIGN, task: { ...DESIGN.task, targetsPerRing: 12 } })).toContain("task.targetsPerRing: must be odd, so every hop crosses the ring");
    expect(await issues({ ...DESIGN, task: { amplitudes: [20], widths: [20] } })).toContain("task.widths.0: every width must be smaller than every amplitude (W < A)");
    expect(await issues({ ...DESIGN, factors: [{ name: "technique", levels: [{ label: "motion" }, { label: "Motion" }] }] })).toContain('factors.0.levels.1.label: duplicate level "Motion"');
    expect(await issues({ ...DESIGN, factors: [{ name: "technique", levels: [{ label: " " }] }] })).toContain("factors.0.levels.0.label: must not be empty");
    expect(await issues({ ...DESIGN, conditionSubset: [] })).toContain("conditionSubset: choose at least one condition");
    expect(await issues({ ...DESIGN, factors: [] })).toContain("factors: add at least one within-subject factor");
  });
});

describe("review, approval and recruitment", () => {
  it("freezes the submitted consent with the SHA-256 of its exact text; refuses approval by a reviewer on the team", async () => {
    const id = await newStudy();
    await saveDesign(db, owner, id, DESIGN);
    await saveConsentDraft(db, editor, id, { body: CONSENT });
    await submitForReview(db, editor, id);
    const v = await db("consent_versions").where({ study_id: id }).first();
    expect(v.status).toBe("submitted");
    expect(v.sha256).toBe(sha256Text(CONSENT));
    expect(await status(saveConsentDraft(db, owner, id, { body: CONSENT + "x" }))).toBe(409); // locked in review
    expect(await status(decideReview(db, owner, id, { decision: "approve" }))).toBe(403); // not a reviewer
    await db("study_members").insert({ study_id: id, user_id: reviewer.id, role: "viewer" });
    expect(await status(decideReview(db, reviewer, id, { decision: "approve" }))).toBe(403); // own study
    await db("study_members").where({ study_id: id, user_id: reviewer.id }).delete();
    expect(await status(decideReview(db, reviewer, id, { decision: "return" }))).toBe(422); // a return needs a comment
    await decideReview(db, reviewer, id, { decision: "approve", comment: "" });
    expect((await db("studies").where({ id }).first()).status).toBe("approved");
  });

  it("a change after approval is an amendment: reviewed on its own while the approved version keeps running", async () => {
    const id = await newStudy();
    await saveDesign(db, owner, id, DESIGN);
    await saveConsentDraft(db, owner, id, { body: CONSENT });
    expect(await status(changeRecruitment(db, owner, id, { action: "open" }))).toBe(409); // not approved
    expect(await recruitmentBlocker(db, id)).toBe("No protocol version is approved yet.");
    await submitForReview(db, owner, id);
    await decideReview(db, reviewer, id, { decision: "approve" });
    expect(await recruitmentBlocker(db, id)).toBeNull();
    await changeRecruitment(db, owner, id, { action: "open", participantCap: 4 });

    // recruiting: the design, the consent text and the information may change, as an amendment
    const changed = await saveDesign(db, owner, id, { ...DESIGN, blocks: 2 });
    expect(changed.amendment).toBe(true);
    const v2 = await saveConsentDraft(db, owner, id, { body: CONSENT + "\nVersion two.\n" });
    expect(v2.version).toBe(2);
    expect((await db("consent_versions").where({ study_id: id, version: 1 }).first()).body_md).toBe(CONSENT); // frozen
    expect((await db("studies").where({ id }).first()).status).toBe("recruiting"); // still running under version 1
    expect((await pendingAmendment(db, id)).changes.map((c) => c.part)).toEqual(["design", "consent"]);

    const amendment = await submitForReview(db, owner, id);
    expect(amendment.version).toBe(2);
    expect((await db("studies").where({ id }).first()).status).toBe("recruiting");
    expect(await status(saveDesign(db, owner, id, { ...DESIGN, blocks: 3 }))).toBe(409); // locked while in review
    expect((await fetchStudiesInReview(db)).some((s) => s.id === id && s.amendment)).toBe(true);
    expect((await fetchInForceVersion(db, id))!.version).toBe(1);
    await decideReview(db, reviewer, id, { decision: "approve" });
    const inForce = (await fetchInForceVersion(db, id))!;
    expect(inForce.version).toBe(2);
    expect((inForce.design as { blocks: number }).blocks).toBe(2);
    expect(inForce.consentVersion).toBe(2);
    expect((await db("studies").where({ id }).first()).status).toBe("recruiting");
    expect(await status(submitForReview(db, owner, id))).toBe(409); // nothing changed since version 2
  });

  it("invitations store only token hashes and encrypted e-mail; codes are P-XXXXXX; the cap holds for the public link", async () => {
    const id = await newStudy();
    await saveDesign(db, owner, id, DESIGN);
    await saveConsentDraft(db, owner, id, { body: CONSENT });
    await submitForReview(db, owner, id);
    await decideReview(db, reviewer, id, { decision: "approve" });
    expect(await status(createInvitations(db, owner, id, { mode: "links", count: 1 }))).toBe(409); // not recruiting yet
    const state = await changeRecruitment(db, owner, id, { action: "open", participantCap: 3, publicLink: true });
    const made = await createInvitations(db, editor, id, { mode: "links", count: 2 });
    expect(await status(createInvitations(db, viewer, id, { mode: "links", count: 1 }))).toBe(403);
    for (const p of made) {
      expect(p.code).toMatch(/^P-[23456789ABCDEFGHJKMNPQRSTUVWXYZ]{6}$/);
      expect(Buffer.from(p.token, "base64url")).toHaveLength(16); // 128 bits
      const row = await db("participants").where({ token_hash: hashToken(p.token) }).first();
      expect(row.code).toBe(p.code);
      expect(JSON.stringify(row)).not.toContain(p.token);
    }
    const publicToken = state.publicLink!.split("/s/public/")[1]!;
    // the cap counts participants who take part (completed, or active within the inactivity time), not unopened invitations
    const visitor = await visitPublicLink(db, publicToken, { panelId: "PANEL-4711" });
    const row = await db("participants").where({ code: visitor.code, study_id: id }).first();
    expect(row.source).toBe("public");
    expect(row.panel_id_encrypted).not.toContain("4711");
    expect(openWithDataKey(row.panel_id_encrypted)).toBe("PANEL-4711");
    expect(await status(visitPublicLink(db, publicToken, { panelId: "PANEL-4711" }))).toBe(409); // the same panel id starts once
    const started = await Promise.allSettled(Array.from({ length: 4 }, () => visitPublicLink(db, publicToken)));
    expect(started.filter((r) => r.status === "fulfilled")).toHaveLength(2); // four at once for the 2 places left under the cap of 3
    expect(await status(visitPublicLink(db, publicToken))).toBe(409); // cap of 3 reached
    expect(await status(visitPublicLink(db, "not-a-real-token-000000"))).toBe(404);

    const p = await insertParticipant(db, id, "email");
    const { sealWithDataKey } = await import("@/lib/recruitment/dataKey");
    await db("participant_contacts").insert({ participant_id: p.id, email_encrypted: sealWithDataKey("someone@mailbox.example") });
    const contact = await db("participant_contacts").where({ participant_id: p.id }).first();
    expect(contact.email_encrypted).not.toContain("someone");
    expect(openWithDataKey(contact.email_encrypted)).toBe("someone@mailbox.example");
  });
});

describe("documents", () => {
  it("stores a PDF with its SHA-256; refuses a wrong type (415) and stores nothing; viewers may read, reviewers not while draft", async () => {
    const id = await newStudy();
    const dir = await mkdtemp(join(tmpdir(), "yawpoint-docs-"));
    const store = localStore(dir);
    const pdf = Buffer.from("%PDF-1.4\n1 0 obj << >> endobj\n%%EOF\n");
    const doc = await saveDocument(db, store, editor, id, { name: "letter.pdf", bytes: pdf, kind: "approval_letter" });
    expect(doc.sha256).toBe(sha256Text(pdf.toString("utf8")));
    expect(doc.mimeType).toBe("application/pdf");
    expect(await status(saveDocument(db, store, owner, id, { name: "x.pdf", bytes: Buffer.from("<html>hi</html>"), kind: "other" }))).toBe(415);
    expect(await status(saveDocument(db, store, viewer, id, { name: "x.pdf", bytes: pdf, kind: "other" }))).toBe(403);
    expect((await readdir(join(dir, "documents", String(id))))).toHaveLength(1);
    expect((await readDocument(db, store, viewer, doc.id)).bytes.equals(pdf)).toBe(true);
    expect(await status(readDocument(db, store, reviewer, doc.id))).toBe(403);
    expect(await status(readDocument(db, store, outsider, doc.id))).toBe(403);
  });
});

describe("audit trail of the study designer", () => {
  it("logs the actions, verifies intact, and names the first tampered row", async () => {
    const id = await newStudy();
    await saveDesign(db, owner, id, DESIGN);
    const actions = (await db("audit_log").where({ study_id: id }).orderBy("id")).map((r: { action: string }) => r.action);
    expect(actions).toEqual(["team.set", "team.set", "study.design"]);
    expect((await verifyAuditChain(db)).intact).toBe(true);
    const row = await db("audit_log").where({ study_id: id, action: "study.design" }).first();
    const dbOwner = ownerDb(); // the application's own user may not change the log (tests/integration/audit.test.ts)
    await dbOwner("audit_log").where({ id: row.id }).update({ actor_label: "someone.else@harbourview-lab.example" });
    expect(await verifyAuditChain(db)).toMatchObject({ intact: false, firstBrokenId: row.id, reason: "its content does not match its hash" });
    await dbOwner("audit_log").where({ id: row.id }).update({ actor_label: row.actor_label });
    await dbOwner.destroy();
    expect((await verifyAuditChain(db)).intact).toBe(true);
  });
});
