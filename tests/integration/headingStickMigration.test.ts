import { afterAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { down, up } from "@/db/migrations/20261203100000_rename_heading_stick";
import { fetchDesign } from "@/lib/study/service/design";
import { conditionConfig, conditionsOf, studyDesignSchema } from "@/lib/study/design";
import { designHash } from "@/lib/study/designHash";

// The heading-stick rename on stored data: a design saved before the rename (stickMode
// "snap-turn", snapTurn* fields) in the base configuration and in a level, with an approved review
// of it, goes up to the new names with its approval still matching, and down again unchanged.

const current = studyDesignSchema.parse({
  baseConfig: { technique: "motion+stick", stickMode: "heading", headingRimThreshold: 0.85 },
  factors: [{ name: "turn", levels: [{ label: "slow turn", config: { headingTurnTimeMs: 250 } }, { label: "rate", config: { stickMode: "rate" } }] }],
  task: { amplitudes: [30], widths: [3] },
  counterbalancing: { method: "williams", seed: 1 },
});
// What the code before the rename stored: the same design in the old words (written out by text
// replacement here, independently of the migration's own rewrite).
const before = JSON.parse(
  JSON.stringify(current).replaceAll('"heading"', '"snap-turn"').replaceAll("headingRimThreshold", "snapTurnThreshold").replaceAll("headingTurnTimeMs", "snapTurnDurationMs"),
) as Record<string, unknown>;
const beforeHash = designHash(before as never);

afterAll(() => db.destroy());

describe("migration 20261203100000_rename_heading_stick", () => {
  it("renames stored designs, keeps their approval valid, and goes back down", async () => {
    const [userId] = await db("users").insert({ email: `rename.${Date.now()}@harbourview-lab.example`, name: "Rena Migration", role: "researcher" });
    const [studyId] = await db("studies").insert({ title: "Heading stick rename", summary: "", owner_id: userId, status: "recruiting", design: JSON.stringify(before), design_hash: beforeHash });
    const [consentId] = await db("consent_versions").insert({ study_id: studyId, version: 1, body_md: "Consent", status: "approved", created_by: userId });
    await db("study_reviews").insert([
      { study_id: studyId, consent_version_id: consentId, design_hash: beforeHash, status: "approved", submitted_by: userId },
      { study_id: studyId, consent_version_id: consentId, design_hash: "0".repeat(64), status: "returned", submitted_by: userId },
    ]);
    // before the migration the current schema cannot read the stored design
    expect((await fetchDesign(db, studyId!)).design).toBeNull();

    await up(db);
    const stored = await fetchDesign(db, studyId!);
    expect(stored.design).toEqual(current);
    expect(stored.designHash).toBe(designHash(current));
    const configs = conditionsOf(stored.design!).map((c) => conditionConfig(stored.design!, c));
    expect(configs.map((c) => [c.stickMode, c.headingRimThreshold, c.headingTurnTimeMs])).toEqual([["heading", 0.85, 250], ["rate", 0.85, 100]]);
    const reviews = await db("study_reviews").where({ study_id: studyId }).orderBy("id").pluck("design_hash");
    expect(reviews).toEqual([designHash(current), "0".repeat(64)]); // recruitment compares these two fingerprints

    await down(db);
    const row = await db("studies").where({ id: studyId }).first("design", "design_hash");
    expect(typeof row.design === "string" ? JSON.parse(row.design) : row.design).toEqual(before);
    expect(row.design_hash).toBe(beforeHash);
    expect(await db("study_reviews").where({ study_id: studyId }).orderBy("id").pluck("design_hash")).toEqual([beforeHash, "0".repeat(64)]);

    await up(db); // leave the database as migrated
  });
});
