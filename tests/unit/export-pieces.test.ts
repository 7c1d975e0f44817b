import { createHmac } from "node:crypto";
import { parse } from "csv-parse/sync";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  buildDataPackage, coarsenAgeBand, coarsenExperience, coarsenHandedness, csvLine, kAnonymity, randomPseudonyms, stablePseudonym,
  trialsTableSpec, sequencesTableSpec, validateDataPackage, valueMatchesFieldType,
} from "@/lib/export";
import { endpointScatter, isEventDriven, learningCurve, progressCounts, qualityFlags } from "@/lib/results";
import { trialCsvHeader } from "@/lib/trials";
import type { SequenceSummary } from "@/lib/analysis";

describe("csvLine", () => {
  it("round-trips any fields through csv-parse (RFC 4180 reference reader)", () => {
    fc.assert(
      fc.property(fc.array(fc.string(), { minLength: 1, maxLength: 6 }), (fields) => {
        const back = parse(csvLine(fields) + "\n", { relax_quotes: false }) as string[][];
        // text that begins with a formula trigger comes back behind a single quote (OWASP CSV Injection; tests/unit/csv-injection.test.ts)
        expect(back[0]).toEqual(fields.map((f) => (/^[=+\-@\t\r]/.test(f) ? `'${f}` : f)));
      }),
    );
  });
  it("writes numbers in shortest round-trip form and missing values as empty fields", () => {
    expect(csvLine([0.1 + 0.2, null, undefined, NaN, true, "a\"b"])).toBe('0.30000000000000004,,,,1,"a""b"');
  });
});

describe("pseudonyms", () => {
  it("stable pseudonyms are HMAC-SHA-256 (RFC 2104) of the participant id under the study secret", () => {
    const secret = "0b".repeat(32);
    // Independent computation with Node's HMAC over the same message; RFC 4231 test case 2 checks that HMAC itself:
    expect(createHmac("sha256", "Jefe").update("what do ya want for nothing?").digest("hex")).toBe("5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843");
    const expected = "s-" + createHmac("sha256", Buffer.from(secret, "hex")).update("participant:42").digest("hex").slice(0, 10);
    expect(stablePseudonym(secret, 42)).toBe(expected);
    expect(stablePseudonym(secret, 42)).toBe(stablePseudonym(secret, 42));
    expect(stablePseudonym("0c".repeat(32), 42)).not.toBe(stablePseudonym(secret, 42));
    expect(() => stablePseudonym("abc", 1)).toThrow("stablePseudonym requires a secret of at least 32 hex digits");
  });
  it("random pseudonyms are a permutation of r-01..r-NN", () => {
    const ids = [5, 9, 11, 12, 40];
    const m = randomPseudonyms(ids);
    expect([...m.keys()]).toEqual(ids);
    expect([...m.values()].sort()).toEqual(["r-01", "r-02", "r-03", "r-04", "r-05"]);
    // over many draws, participant 5 is not always r-01 (a fixed mapping would leak the order)
    const firsts = new Set(Array.from({ length: 60 }, () => randomPseudonyms(ids).get(5)));
    expect(firsts.size).toBeGreaterThan(1);
  });
});

describe("kAnonymity (Sweeney 2002: every quasi-identifier combination shared by at least k rows)", () => {
  it("is the smallest equivalence class, by hand", () => {
    const rows = [
      { age: "18-29", hand: "right" }, { age: "18-29", hand: "right" }, { age: "18-29", hand: "right" },
      { age: "30-44", hand: "left" }, { age: "30-44", hand: "left" },
      { age: "45-64", hand: "right" },
    ];
    const r = kAnonymity(rows, ["age", "hand"], 2);
    expect(r.k).toBe(1);
    expect(r.smallGroups).toEqual([{ values: { age: "45-64", hand: "right" }, size: 1 }]);
    expect(kAnonymity(rows, ["hand"], 5).k).toBe(2);
    expect(kAnonymity([], ["hand"]).k).toBe(0);
  });
  it("never grows when a quasi-identifier is added (property)", () => {
    fc.assert(
      fc.property(fc.array(fc.record({ a: fc.constantFrom("x", "y"), b: fc.constantFrom("p", "q", "r") }), { minLength: 1, maxLength: 30 }), (rows) => {
        expect(kAnonymity(rows, ["a", "b"]).k).toBeLessThanOrEqual(kAnonymity(rows, ["a"]).k);
      }),
    );
  });
});

describe("coarsening", () => {
  it("widens age bands and maps words to few categories", () => {
    expect(["25-34", "18–24", "65+", "17", "", null, "45-54"].map(coarsenAgeBand)).toEqual(["18-29", "18-29", "65+", "under 18", "", "", "45-64"]);
    expect(["Left-handed", "right", "both", "", null].map(coarsenHandedness)).toEqual(["left", "right", "mixed", "", ""]);
    expect([1, 3, 7, "never", "daily", ""].map(coarsenExperience)).toEqual(["none", "some", "much", "none", "much", ""]);
  });
});

describe("data package", () => {
  it("trials.csv's columns are the trial-table header of the public interface", () => {
    const spec = trialsTableSpec("px", ["gain", "technique"]);
    expect(csvLine(spec.fields.map((f) => f.name))).toBe(trialCsvHeader(["gain", "technique"], true));
  });
  it("validates against Data Package v1 / Table Schema v1, and the validator rejects what the specification forbids", () => {
    const dp = buildDataPackage({ id: 3, title: "Gyro Study!", description: "d", created: new Date(0) }, [trialsTableSpec("mm", ["technique"]), sequencesTableSpec("mm")]);
    expect(dp.name).toBe("yawpoint-study-3-gyro-study");
    expect(validateDataPackage(dp)).toEqual([]);
    expect(validateDataPackage({})).not.toEqual([]); // resources are required
    expect(validateDataPackage({ resources: [{ path: "a.csv" }] }).join()).toContain("name"); // a resource needs a name
    expect(validateDataPackage({ resources: [{ name: "A b", path: "a.csv" }] })).not.toEqual([]); // name pattern
    expect(validateDataPackage({ resources: [{ name: "a" }] }).join()).toContain("path or data");
    expect(validateDataPackage({ resources: [{ name: "a", path: "../a.csv" }] })).not.toEqual([]);
    expect(validateDataPackage({ resources: [{ name: "a", path: "a.csv", schema: { fields: [{ name: "x", type: "float" }] } }] })).not.toEqual([]); // not a Table Schema type
    expect(validateDataPackage({ resources: [{ name: "a", path: "a.csv", schema: { fields: [{ name: "x" }], primaryKey: ["y"] } }] }).join()).toContain("primary key");
  });
  it("checks values by Table Schema type with the default formats", () => {
    expect(valueMatchesFieldType("12", "integer")).toBe(true);
    expect(valueMatchesFieldType("1.5", "integer")).toBe(false);
    expect(valueMatchesFieldType("-1.5e-3", "number")).toBe(true);
    expect(valueMatchesFieldType("1,5", "number")).toBe(false);
    expect(valueMatchesFieldType("2026-03-02T09:00:00.000Z", "datetime")).toBe(true);
    expect(valueMatchesFieldType("yes", "boolean")).toBe(false);
  });
});

const seq = (p: string, c: string, block: number, tp: number, we = 40, width = 40): SequenceSummary =>
  ({ participant: p, condition: c, block, sequence: 1, amplitude: 400, width, n: 12, errorRate: 0, ae: 400, sdx: we / 4.133, we, ide: 3, mt: 1000, tp, id: 3.4, excluded: 0, timedOut: 0 });

describe("results pieces", () => {
  it("learning curve is a mean of participant means (not pooled over sequences)", () => {
    // P1 has two block-1 sequences (2 and 4 → 3), P2 one (6): mean of means 4.5, pooled mean would be 4
    const pts = learningCurve([seq("P1", "c", 1, 2), { ...seq("P1", "c", 1, 4), sequence: 2 }, seq("P2", "c", 1, 6)]);
    expect(pts).toEqual([{ condition: "c", block: 1, tp: 4.5, participants: 2 }]);
  });
  it("end points: along/across the task axis in W, and misfires counted by reason (common practice rule)", () => {
    // S (0,0) → T (100,0), W = 10: P (105, -3) overshoots by 0.5 W, 0.3 W to the right-hand (negative y) side
    const base = { participant: "P", condition: "c", block: 1, sequence: 1, trial: 1, amplitude: 100, width: 10, fromX: 0, fromY: 0, toX: 100, toY: 0, startX: 0, startY: 0, timeMs: 500, hit: true, factors: {} };
    const { clouds, exclusions } = endpointScatter(
      [{ ...base, endX: 105, endY: -3 }, { ...base, endX: 30, endY: 0, hit: false }, { ...base, endX: 100, endY: 25, hit: false }],
      [seq("P", "c", 1, 3, 12, 10)],
    );
    expect(clouds[0]!.points[0]!.x).toBeCloseTo(0.5, 12);
    expect(clouds[0]!.points[0]!.y).toBeCloseTo(-0.3, 12);
    expect(clouds[0]!.weOverW).toBeCloseTo(1.2, 12);
    expect(exclusions).toEqual({ short: 1, far: 2, removed: 2 });
  });
  it("progress counts per status and row", () => {
    const p = progressCounts([{ status: "completed", cbRow: 1 }, { status: "completed", cbRow: 0 }, { status: "withdrawn", cbRow: 0 }, { status: "invited", cbRow: null }]);
    expect(p.byRow.map((r) => [r.row, r.total])).toEqual([[0, 2], [1, 1], [null, 1]]);
    expect(p.byStatus.completed).toBe(2);
  });
  it("quality flags name the limit that was crossed", () => {
    const flags = qualityFlags({ sampleRateHz: 31, maxGapMs: 250, dropped: 2, hasStream: true, errorRate: 0.4, excluded: 1, kept: 11 }, { minSampleRateHz: 50, maxGapMs: 100, maxErrorRate: 0.25 });
    expect(flags.map((f) => f.text)).toEqual([
      "sensor rate 31 Hz is below the study's minimum of 50 Hz", "a gap of 250 ms between samples (limit 100 ms)", "2 invalid sample(s) refused by the engine",
      "1 misfire(s) removed by the exclusion rule", "error rate 40 % is above 25 %",
    ]);
    expect(qualityFlags({ sampleRateHz: 60, maxGapMs: 20, dropped: 0, hasStream: true, errorRate: 0.04, excluded: 0, kept: 12 }, { minSampleRateHz: 50, maxGapMs: 100, maxErrorRate: 0.25 })).toEqual([]);
  });
  it("a mouse or a touch screen is not held to a sensor rate: it reports only when used (W3C Pointer Events: events on change, no sampling rate)", () => {
    const tapOnly = { sampleRateHz: 1.4, maxGapMs: 1272, dropped: 0, hasStream: true, errorRate: 0.4, excluded: 0, kept: 5 };
    const limits = { minSampleRateHz: 50, maxGapMs: 100, maxErrorRate: 0.25 };
    expect(qualityFlags({ ...tapOnly, eventDriven: true }, limits).map((f) => f.text)).toEqual(["error rate 40 % is above 25 %"]);
    expect(qualityFlags(tapOnly, limits)).toHaveLength(3); // the same stream from a motion sensor is flagged
    expect(["touch", "mouse", "motion", "stick", "motion+touch"].map(isEventDriven)).toEqual([true, true, false, false, false]);
  });
});
