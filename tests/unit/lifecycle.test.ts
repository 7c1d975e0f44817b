import { devices } from "@playwright/test";
import { describe, expect, it } from "vitest";
import { createSeededRandom } from "@/lib/motion/simulate";
import { drawSimulatedPerson } from "@/lib/pilot/simulatedSession";
import { erasureDeadline } from "@/lib/recruitment/erasureWindow";
import { returnAddress } from "@/lib/recruitment/returnAddress";
import { deviceSummary } from "@/lib/runner/deviceSummary";
import { firstFreeSlot, holdsPlace, placeBalance } from "@/lib/study/counterbalance";
import { studyDesignSchema } from "@/lib/study/design";
import { designText, protocolChanges, type ProtocolContent } from "@/lib/study/protocolChanges";

const fourConditions = studyDesignSchema.parse({
  factors: [{ name: "gain", levels: [1, 2, 3, 4].map((g) => ({ label: `g${g}`, config: { gain: g } })) }],
  task: { amplitudes: [300], widths: [30] },
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 6,
});

describe("counterbalancing places with replacement", () => {
  it("the next participant takes the first free place", () => {
    expect(firstFreeSlot([])).toBe(0);
    expect(firstFreeSlot([0, 1, 3])).toBe(2);
    expect(firstFreeSlot([1, 2])).toBe(0);
  });

  it("a place is held by the completed and by the active within the inactivity time, never by the withdrawn or released", () => {
    const at = (minutesAgo: number) => new Date(Date.UTC(2026, 11, 3, 12) - minutesAgo * 60_000);
    const now = Date.UTC(2026, 11, 3, 12), hour = 3600_000;
    expect(holdsPlace({ slot: 0, status: "completed", releasedAt: null, lastActivityAt: at(600) }, now, hour)).toBe(true);
    expect(holdsPlace({ slot: 0, status: "in_progress", releasedAt: null, lastActivityAt: at(59) }, now, hour)).toBe(true);
    expect(holdsPlace({ slot: 0, status: "in_progress", releasedAt: null, lastActivityAt: at(61) }, now, hour)).toBe(false);
    expect(holdsPlace({ slot: 0, status: "withdrawn", releasedAt: null, lastActivityAt: at(1) }, now, hour)).toBe(false);
    expect(holdsPlace({ slot: 0, status: "in_progress", releasedAt: at(1), lastActivityAt: at(1) }, now, hour)).toBe(false);
  });

  it("the balance table has the Williams square's rows, the planned participants spread over them in order", () => {
    // Williams (1949) for n = 4: first row 0, 1, n−1, 2, each next row adding 1 (mod n)
    const cells = placeBalance(fourConditions, [{ slot: 0, state: "completed" }, { slot: 5, state: "in_progress" }, { slot: 2, state: "completed" }], 6);
    expect(cells.map((c) => c.order)).toEqual([[0, 1, 3, 2], [1, 2, 0, 3], [2, 3, 1, 0], [3, 0, 2, 1]]);
    // 6 planned over 4 rows: participant i takes row i mod 4, so rows 1–2 plan two, rows 3–4 one
    expect(cells.map((c) => [c.planned, c.completed, c.inProgress, c.free])).toEqual([[2, 1, 0, 1], [2, 0, 1, 1], [1, 1, 0, 0], [1, 0, 0, 1]]);
  });

  it("with the cap at the planned count, replacing drop-outs leaves the completed filling every row once (property over random drop-outs)", () => {
    const rng = createSeededRandom(13);
    for (let run = 0; run < 300; run++) {
      const active = new Set<number>();
      const done: number[] = [];
      while (done.length < 4) {
        // the cap (completed + active ≤ 4) lets a newcomer in only while a place is free
        if (done.length + active.size < 4) active.add(firstFreeSlot([...active, ...done]));
        const someone = [...active][Math.floor(rng.uniform() * active.size)]!;
        active.delete(someone);
        if (rng.uniform() < 0.6) done.push(someone); // else a drop-out: the place is free again
      }
      const rows = placeBalance(fourConditions, done.map((slot) => ({ slot, state: "completed" as const })), 4);
      expect(rows.map((r) => r.completed), `run ${run}: places ${done.join(", ")}`).toEqual([1, 1, 1, 1]);
    }
  });
});

describe("return addresses", () => {
  it("fill in the completion code and the panel id, percent-encoded as URL components (RFC 3986 §2.1, WHATWG URL)", () => {
    expect(returnAddress("https://panel.example/done?c={code}&p={panel_id}", { code: "H4TW9-QC2NB", panelId: "A B&C" })).toBe("https://panel.example/done?c=H4TW9-QC2NB&p=A%20B%26C");
    expect(returnAddress("https://panel.example/done", { code: "H4TW9-QC2NB" })).toBe("https://panel.example/done?code=H4TW9-QC2NB");
    expect(returnAddress("https://panel.example/screened", {})).toBe("https://panel.example/screened");
  });
  it("are only http(s) addresses", () => {
    expect(returnAddress("javascript:alert(1)", { code: "X" })).toBeNull();
    expect(returnAddress("not a url", {})).toBeNull();
    expect(returnAddress(null, { code: "X" })).toBeNull();
  });
});

describe("protocol changes", () => {
  const base: ProtocolContent = { title: "Aiming", summary: "Information.", design: { b: 1, a: [1, 2] }, consentBody: "Consent.", invitationText: null, erasureWindowDays: 30 };
  it("a design with its keys in another order is the same design (RFC 8785 canonical JSON)", () => {
    expect(protocolChanges(base, { ...base, design: { a: [1, 2], b: 1 } })).toEqual([]);
    expect(designText({ b: 1, a: 2 })).toBe('{\n  "a": 2,\n  "b": 1\n}\n');
  });
  it("names each part that changed, in the order a reviewer reads them", () => {
    const changed = protocolChanges(base, { ...base, summary: "New information.", design: { b: 2, a: [1, 2] }, invitationText: "Dear …", erasureWindowDays: null });
    expect(changed.map((c) => c.part)).toEqual(["information", "design", "invitation", "erasure window"]);
    expect(changed.at(-1)).toMatchObject({ before: "30 days after the session\n", after: "no limit stated\n" });
  });
});

describe("coarse device summary", () => {
  // the user agents of Playwright's device descriptors (@playwright/test `devices`), as those browsers send them
  it.each([
    ["iPhone 13", "phone-or-tablet", "safari", "ios"],
    ["Pixel 7", "phone-or-tablet", "chromium", "android"],
    ["Desktop Chrome", "desktop", "chromium", "windows"],
    ["Desktop Firefox", "desktop", "firefox", "windows"],
    ["Desktop Safari", "desktop", "safari", "macos"],
  ] as const)("%s: %s, %s, %s", (name, deviceClass, browserFamily, osFamily) => {
    expect(deviceSummary(devices[name]!.userAgent, 390)).toMatchObject({ deviceClass, browserFamily, osFamily });
  });
});

describe("the erasure window", () => {
  it("ends the stated number of days after the session (30 days after 1 March is 31 March, Gregorian calendar)", () => {
    expect(erasureDeadline(30, new Date("2026-03-01T10:00:00Z"))!.toISOString()).toBe("2026-03-31T10:00:00.000Z");
    expect(erasureDeadline(null, new Date())).toBeNull();
  });
});

describe("simulated people", () => {
  it("differ by log-normal multipliers whose log has the chosen spread as its SD (definition of the log-normal)", () => {
    const rng = createSeededRandom(7);
    const logs = Array.from({ length: 4000 }, () => Math.log(drawSimulatedPerson(rng, 0.2).speed));
    const mean = logs.reduce((a, b) => a + b, 0) / logs.length;
    const sd = Math.sqrt(logs.reduce((a, b) => a + (b - mean) ** 2, 0) / (logs.length - 1));
    // SE of a sample SD ≈ σ/√(2(n−1)) = 0.0022 (normal theory, from memory): 4 SE either side
    expect(Math.abs(sd - 0.2)).toBeLessThan(0.009);
    expect(Math.abs(mean)).toBeLessThan(4 * 0.2 / Math.sqrt(4000));
    expect(drawSimulatedPerson(createSeededRandom(1), 0)).toMatchObject({ speed: 1, precision: 1 });
  });
});
