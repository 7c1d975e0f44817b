import { describe, expect, it } from "vitest";
import { studyDesignSchema, conditionsOf, type StudyDesignInput } from "@/lib/study/design";
import { allOrders, betweenLevelsFor, counterbalancingRows, cyclicRows, orderForParticipant, plannedRowsWarning, randomRows, williamsRows } from "@/lib/study/counterbalance";

const isPermutation = (row: number[], n: number) => [...row].sort((a, b) => a - b).every((v, i) => v === i) && row.length === n;

/** Counts of each ordered neighbour pair (a, b), a ≠ b, over all rows. */
function neighbourPairs(rows: number[][]): Map<string, number> {
  const m = new Map<string, number>();
  for (const r of rows) for (let i = 0; i + 1 < r.length; i++) m.set(`${r[i]}>${r[i + 1]}`, (m.get(`${r[i]}>${r[i + 1]}`) ?? 0) + 1);
  return m;
}

describe("williamsRows — Williams, E. J. (1949), Aust. J. Sci. Res. A 2:149–168", () => {
  for (let n = 2; n <= 8; n++) {
    const rows = williamsRows(n);
    it(`n = ${n}: ${n % 2 === 0 ? "n" : "2n"} rows, each a permutation`, () => {
      expect(rows.length).toBe(n % 2 === 0 ? n : 2 * n);
      for (const r of rows) expect(isPermutation(r, n)).toBe(true);
    });
    it(`n = ${n}: each condition equally often in every position (once per n rows)`, () => {
      const perPosition = rows.length / n;
      for (let pos = 0; pos < n; pos++) {
        const counts = new Array<number>(n).fill(0);
        for (const r of rows) counts[r[pos]!]!++;
        expect(counts).toEqual(new Array<number>(n).fill(perPosition));
      }
    });
    it(`n = ${n}: every ordered neighbour pair ${n % 2 === 0 ? "exactly once" : "exactly twice"}`, () => {
      const pairs = neighbourPairs(rows);
      expect(pairs.size).toBe(n * (n - 1)); // every ordered pair a ≠ b occurs
      for (const count of pairs.values()) expect(count).toBe(n % 2 === 0 ? 1 : 2);
    });
  }
  it("odd n: the second n rows are the first n reversed (Williams 1949, odd case)", () => {
    const rows = williamsRows(5);
    for (let r = 0; r < 5; r++) expect(rows[r + 5]).toEqual([...rows[r]!].reverse());
  });
  it("matches the 4-condition square as commonly printed (A B D C / B C A D / C D B A / D A C B; from memory)", () => {
    expect(williamsRows(4)).toEqual([
      [0, 1, 3, 2],
      [1, 2, 0, 3],
      [2, 3, 1, 0],
      [3, 0, 2, 1],
    ]);
  });
  it("first row follows 0, 1, n−1, 2, n−2, … (Williams 1949)", () => {
    expect(williamsRows(6)[0]).toEqual([0, 1, 5, 2, 4, 3]);
    expect(williamsRows(7)[0]).toEqual([0, 1, 6, 2, 5, 3, 4]);
  });
  it("refuses nonsense sizes", () => {
    expect(() => williamsRows(0)).toThrow("williamsRows requires a whole number of conditions from 1 to 64, got 0");
    expect(() => williamsRows(2.5)).toThrow(/williamsRows/);
  });
});

describe("cyclicRows — Latin square definition (each symbol once per row and column; common practice)", () => {
  for (let n = 2; n <= 8; n++) {
    it(`n = ${n}: each condition once per row and once per column`, () => {
      const rows = cyclicRows(n);
      expect(rows.length).toBe(n);
      for (const r of rows) expect(isPermutation(r, n)).toBe(true);
      for (let c = 0; c < n; c++) expect(isPermutation(rows.map((r) => r[c]!), n)).toBe(true);
    });
  }
  it("cell (r, c) = (r + c) mod n", () => expect(cyclicRows(3)).toEqual([[0, 1, 2], [1, 2, 0], [2, 0, 1]]));
});

describe("allOrders — complete counterbalancing, n! orders (common practice)", () => {
  const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));
  for (let n = 1; n <= 4; n++) {
    it(`n = ${n}: ${factorial(n)} distinct permutations`, () => {
      const rows = allOrders(n);
      expect(rows.length).toBe(factorial(n));
      expect(new Set(rows.map((r) => r.join(","))).size).toBe(rows.length);
      for (const r of rows) expect(isPermutation(r, n)).toBe(true);
    });
  }
  it("refuses more than 4 conditions", () => expect(() => allOrders(5)).toThrow("allOrders requires 1 to 4 conditions, got 5"));
});

describe("randomRows — seeded Fisher–Yates (Durstenfeld 1964)", () => {
  it("the same seed gives the same rows; another seed other rows", () => {
    expect(randomRows(6, 42, 20)).toEqual(randomRows(6, 42, 20));
    expect(randomRows(6, 42, 20)).not.toEqual(randomRows(6, 43, 20));
  });
  it("every row is a permutation", () => {
    for (const r of randomRows(7, 9, 50)) expect(isPermutation(r, 7)).toBe(true);
  });
  it("roughly uniform: each condition first about 1/n of the time (6000 rows, n = 3, ±5 %)", () => {
    const counts = [0, 0, 0];
    for (const r of randomRows(3, 123, 6000)) counts[r[0]!]!++;
    for (const c of counts) expect(Math.abs(c / 6000 - 1 / 3)).toBeLessThan(0.05);
  });
  it("refuses a bad seed or count", () => {
    expect(() => randomRows(3, -1, 2)).toThrow(/seed/);
    expect(() => randomRows(3, 1, 0)).toThrow(/row count/);
  });
});

const design2x2: StudyDesignInput = {
  factors: [
    { name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }, { label: "stick", config: { technique: "stick" } }] },
    { name: "gain", levels: [{ label: "gain 4", config: { gain: 4 } }, { label: "gain 8", config: { gain: 8 } }] },
  ],
  task: { amplitudes: [300, 500], widths: [40, 80] },
  counterbalancing: { method: "williams", seed: 1 },
};

describe("counterbalancingRows and orderForParticipant on a design", () => {
  const parse = (over: Partial<StudyDesignInput>) => studyDesignSchema.parse({ ...design2x2, ...over });
  it("williams over the 4 conditions of a 2 × 2 crossing", () => {
    const d = parse({});
    expect(conditionsOf(d).length).toBe(4);
    expect(counterbalancingRows(d)).toEqual(williamsRows(4));
  });
  it("a chosen subset of 3 conditions gives 6 Williams rows (odd n)", () => {
    const d = parse({ conditionSubset: ["motion / gain 4", "motion / gain 8", "stick / gain 4"] });
    expect(counterbalancingRows(d)).toEqual(williamsRows(3));
  });
  it("cyclic, all orders and random follow the method", () => {
    expect(counterbalancingRows(parse({ counterbalancing: { method: "cyclic", seed: 1 } }))).toEqual(cyclicRows(4));
    expect(counterbalancingRows(parse({ counterbalancing: { method: "all-orders", seed: 1 } }))).toHaveLength(24);
    const r = counterbalancingRows(parse({ counterbalancing: { method: "random", seed: 77 }, plannedParticipants: 10 }));
    expect(r).toEqual(randomRows(4, 77, 10));
  });
  it("participant i gets row i mod rows (science: recruit in multiples of the row count)", () => {
    const d = parse({});
    expect(orderForParticipant(d, 0)).toEqual({ row: 0, order: [0, 1, 3, 2] });
    expect(orderForParticipant(d, 5)).toEqual({ row: 1, order: [1, 2, 0, 3] });
    expect(() => orderForParticipant(d, -1)).toThrow(/participant index/);
  });
  it("warns when N is not a multiple of the rows", () => {
    expect(plannedRowsWarning(12, 4)).toBeNull();
    expect(plannedRowsWarning(10, 4)).toBe("10 participants is not a multiple of the 4 orders: rows 1–2 get one more participant than rows 3–4. Plan 8 or 12.");
    expect(plannedRowsWarning(3, 6)).toContain("Plan 6.");
  });
});

describe("the design refuses more conditions than its counterbalancing orders (and the page's order preview never throws)", () => {
  const four = (name: string) => ({ name, levels: [1, 2, 3, 4].map((i) => ({ label: `${name} ${i}`, config: {} })) });
  const big = { ...design2x2, factors: [four("a"), four("b"), four("c"), four("d")] }; // 4 × 4 × 4 × 4 = 256
  const methodIssue = (over: Partial<StudyDesignInput>) => {
    const r = studyDesignSchema.safeParse({ ...big, ...over });
    return r.success ? null : (r.error.issues.find((i) => i.path.join(".") === "counterbalancing.method")?.message ?? null);
  };
  it("the full 4 × 4 × 4 × 4 crossing (256 conditions) is refused at the method, for every method", () => {
    for (const method of ["williams", "cyclic", "random", "all-orders"] as const) {
      expect(methodIssue({ counterbalancing: { method, seed: 1 } })).toMatch(/^256 conditions are more than this method orders \(at most (64|4)/);
    }
  });
  it("a chosen subset of 16 of them is accepted, and its Williams square (Williams 1949: n rows for even n) is built", () => {
    const labels = conditionsOf(studyDesignSchema.parse({ ...big, conditionSubset: null, factors: [four("a"), four("b")] })).map((c) => c.label);
    expect(labels).toHaveLength(16);
    const subset = labels.map((l, i) => `${l} / c ${(i % 4) + 1} / d ${((i >> 2) % 4) + 1}`);
    expect(methodIssue({ conditionSubset: subset })).toBeNull();
    const d = studyDesignSchema.parse({ ...big, conditionSubset: subset });
    expect(counterbalancingRows(d)).toEqual(williamsRows(16));
  });
  it("levels that conflict only in a combination nobody runs are accepted; run, the combination is refused", () => {
    // a two-level curve needs its fast speed above its slow speed (docs/configuration.md)
    const conflict = {
      ...design2x2,
      baseConfig: { gainCurve: "two-level" },
      factors: [
        // each level alone is fine over the defaults (slow 5, fast 30 deg/s); slow 20 with fast 10 is not
        { name: "slow", levels: [{ label: "slow 5", config: { curveSlowSpeedDegPerS: 5 } }, { label: "slow 20", config: { curveSlowSpeedDegPerS: 20 } }] },
        { name: "fast", levels: [{ label: "fast 10", config: { curveFastSpeedDegPerS: 10 } }, { label: "fast 40", config: { curveFastSpeedDegPerS: 40 } }] },
      ],
    };
    const all = studyDesignSchema.safeParse(conflict);
    expect(all.success).toBe(false);
    expect(all.error!.issues.map((i) => i.message).join("\n")).toMatch(/condition "slow 20 \/ fast 10"/);
    expect(studyDesignSchema.safeParse({ ...conflict, conditionSubset: ["slow 5 / fast 10", "slow 5 / fast 40", "slow 20 / fast 40"] }).success).toBe(true);
  });
  it("all orders stops at 4 conditions (4! = 24 rows); the 2 × 2 passes, a fifth condition is refused", () => {
    expect(studyDesignSchema.safeParse({ ...design2x2, counterbalancing: { method: "all-orders", seed: 1 } }).success).toBe(true);
    const five = { ...design2x2, factors: [{ name: "gain", levels: [1, 2, 3, 4, 5].map((g) => ({ label: `gain ${g}`, config: { gain: g } })) }], counterbalancing: { method: "all-orders" as const, seed: 1 } };
    const r = studyDesignSchema.safeParse(five);
    expect(r.success).toBe(false);
    expect(r.error!.issues.find((i) => i.path.join(".") === "counterbalancing.method")?.message).toMatch(/^5 conditions .*at most 4; the Latin squares take up to 64/);
  });
});

describe("betweenLevelsFor: between-subject groups crossed with the counterbalancing rows", () => {
  // A full factorial crossing: every combination of the between factors' levels is a group, and
  // counterbalancing is done within each group (common practice for mixed designs; from memory:
  // MacKenzie 2013, Human-Computer Interaction: An Empirical Research Perspective, ch. 5).
  const mixed = studyDesignSchema.parse({
    factors: [{ name: "gain", levels: [{ label: "g2", config: {} }, { label: "g4", config: {} }, { label: "g6", config: {} }, { label: "g8", config: {} }] }],
    betweenFactors: [{ name: "hand", levels: ["left", "right"] }, { name: "device", levels: ["phone", "tablet"] }],
    task: { amplitudes: [256], widths: [32] },
    counterbalancing: { method: "williams" },
  });
  const rows = counterbalancingRows(mixed).length; // Williams, 4 conditions: 4 rows

  it("over rows × groups participants, every (group, order) pair occurs exactly once", () => {
    const seen = new Set<string>();
    for (let i = 0; i < rows * 4; i++) {
      const levels = betweenLevelsFor(mixed, i);
      seen.add(`${levels.hand}/${levels.device}/${orderForParticipant(mixed, i).row}`);
    }
    expect(rows).toBe(4);
    expect(seen.size).toBe(rows * 4);
  });

  it("the two between factors are crossed, not confounded: all four combinations, equally often", () => {
    const counts = new Map<string, number>();
    for (let i = 0; i < 2 * rows * 4; i++) {
      const l = betweenLevelsFor(mixed, i);
      counts.set(`${l.hand}/${l.device}`, (counts.get(`${l.hand}/${l.device}`) ?? 0) + 1);
    }
    expect([...counts.keys()].sort()).toEqual(["left/phone", "left/tablet", "right/phone", "right/tablet"]);
    expect(new Set(counts.values())).toEqual(new Set([2 * rows]));
  });

  it("the first `rows` participants form one group and take every order once", () => {
    const first = Array.from({ length: rows }, (_, i) => betweenLevelsFor(mixed, i));
    expect(new Set(first.map((l) => JSON.stringify(l))).size).toBe(1);
    expect(new Set(Array.from({ length: rows }, (_, i) => orderForParticipant(mixed, i).row)).size).toBe(rows);
    expect(betweenLevelsFor(mixed, rows)).not.toEqual(first[0]);
  });

  it("no between factors: no levels; a bad index is refused", () => {
    const within = studyDesignSchema.parse({ factors: mixed.factors, task: { amplitudes: [256], widths: [32] }, counterbalancing: { method: "williams" } });
    expect(betweenLevelsFor(within, 3)).toEqual({});
    expect(() => betweenLevelsFor(mixed, -1)).toThrow(/whole-number/);
  });
});
