import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PEOPLE, DEMO_STUDY } from "@/db/seeds/demo-scenario";
import { seedDemo } from "@/db/seeds/demo";
import { verifyPassword } from "@/lib/auth/password";
import { assertCanEditStudy, assertCanViewStudy, assertOwnsStudy, requireRole, type SessionUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { addTeamMember, insertStudy } from "@/lib/data/studies";
import { AppError } from "@/lib/errors";

const asUser = async (email: string): Promise<SessionUser> => {
  const row = await db("users").where({ email }).first();
  return { id: row.id, email: row.email, name: row.name, role: row.role };
};

async function status(p: Promise<unknown>): Promise<number> {
  try {
    await p;
    return 200;
  } catch (e) {
    if (e instanceof AppError) return e.status;
    throw e;
  }
}

beforeAll(async () => {
  await seedDemo(db);
});
afterAll(async () => {
  await db.destroy();
});

describe("demo seed", () => {
  it("creates the lab's people with their roles and working passwords, and is idempotent", async () => {
    const again = await seedDemo(db);
    expect(again.created).toEqual([]);
    for (const p of DEMO_PEOPLE) {
      const row = await db("users").where({ email: p.email }).first();
      expect(row.role).toBe(p.role);
      expect(await verifyPassword(p.password, row.password_hash)).toBe(true);
      expect(await verifyPassword(p.password + "x", row.password_hash)).toBe(false);
    }
    // other test files add studies of their own; the demo study itself exists exactly once
    expect(await db("studies").where({ title: DEMO_STUDY.title }).count({ n: "*" }).first()).toEqual({ n: 1 });
  });
});

describe("role helpers against the database", () => {
  it("requireRole answers 401 without a user and 403 for the wrong role", async () => {
    const reviewer = await asUser("ethics@harbourview-lab.example");
    expect(await status(Promise.resolve().then(() => requireRole(null, "admin")))).toBe(401);
    expect(await status(Promise.resolve().then(() => requireRole(reviewer, "admin")))).toBe(403);
    expect(await status(Promise.resolve().then(() => requireRole(reviewer, "reviewer")))).toBe(200);
  });

  it("team roles: owner edits and owns, editor edits, viewer only views, outsiders are refused", async () => {
    const tomas = await asUser("tomas@harbourview-lab.example");
    const priya = await asUser("priya@harbourview-lab.example");
    const reviewer = await asUser("ethics@harbourview-lab.example");
    const admin = await asUser("admin@harbourview-lab.example");
    const studyId = await insertStudy(db, { title: "Guard test study", summary: "", protocolNumber: null, ownerId: tomas.id });
    expect(await status(assertCanViewStudy(db, priya, studyId))).toBe(403);
    await addTeamMember(db, studyId, priya.id, "viewer");
    expect(await status(assertCanViewStudy(db, priya, studyId))).toBe(200);
    expect(await status(assertCanEditStudy(db, priya, studyId))).toBe(403);
    await addTeamMember(db, studyId, priya.id, "editor");
    expect(await status(assertCanEditStudy(db, priya, studyId))).toBe(200);
    expect(await status(assertOwnsStudy(db, priya, studyId))).toBe(403);
    expect(await status(assertOwnsStudy(db, tomas, studyId))).toBe(200);
    // Reviewers read studies that reached review, never drafts; admins do not read study data.
    expect(await status(assertCanViewStudy(db, reviewer, studyId))).toBe(403);
    await db("studies").where({ id: studyId }).update({ status: "in_review" });
    expect(await status(assertCanViewStudy(db, reviewer, studyId))).toBe(200);
    expect(await status(assertCanEditStudy(db, reviewer, studyId))).toBe(403);
    expect(await status(assertCanViewStudy(db, admin, studyId))).toBe(403);
    expect(await status(assertCanViewStudy(db, tomas, 999_999))).toBe(404);
    expect(await status(assertCanViewStudy(db, null, studyId))).toBe(401);
  });
});
