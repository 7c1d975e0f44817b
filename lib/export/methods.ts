import type { ExclusionRule } from "../analysis/options";
import type { StudyDesign } from "../study/design";

/** What the methods paragraph needs beyond the design. */
export interface MethodsFacts {
  participants: number;
  completed: number;
  withdrawnLeftOut: number;
  conditions: string[];
  /** Nominal IDs of the A×W pairs actually run, bits. */
  idRange: [number, number] | null;
  /** Effective ID range observed, bits. */
  ideRange: [number, number] | null;
  movements: number;
  excluded: number;
  sequencesDropped: number;
  start: "actual" | "nominal";
  exclude: ExclusionRule;
  unit: string;
  /** Exclusions the research team made (whole participants or sequences), with their reasons. */
  researcherExclusions?: { scope: "participant" | "sequence"; reason: string; movements: number }[];
  /** Participants per protocol version they ran (amendments). */
  protocolVersions?: { version: number | null; participants: number }[];
}

/**
 * The sentence on the team's exclusions (researcherExclusionText): how many participants and
 * sequences, how many movements, and each distinct reason with its count; empty when none.
 * Cost: O(exclusions). @throws never.
 * @example researcherExclusionText([{ scope: "sequence", reason: "sensor rate too low", movements: 9 }]) // " The research team excluded 1 sequence (9 movements): sensor rate too low (1)."
 */
export function researcherExclusionText(exclusions: NonNullable<MethodsFacts["researcherExclusions"]>): string {
  if (exclusions.length === 0) return "";
  const people = exclusions.filter((e) => e.scope === "participant").length;
  const seqs = exclusions.length - people;
  const parts = [people ? `${people} participant${people === 1 ? "" : "s"}` : "", seqs ? `${seqs} sequence${seqs === 1 ? "" : "s"}` : ""].filter(Boolean);
  const reasons = new Map<string, number>();
  for (const e of exclusions) reasons.set(e.reason, (reasons.get(e.reason) ?? 0) + 1);
  const movements = exclusions.reduce((a, e) => a + e.movements, 0);
  return ` The research team excluded ${parts.join(" and ")} (${movements} movements) before analysis: ${[...reasons.entries()].map(([r, n]) => `${r} (${n})`).join("; ")}.`;
}

/** The sentence on protocol versions when participants ran more than one (amendments); empty otherwise. */
export function protocolVersionText(versions: NonNullable<MethodsFacts["protocolVersions"]>): string {
  const known = versions.filter((v) => v.version !== null);
  if (known.length < 2) return known.length === 1 ? ` All participants ran protocol version ${known[0]!.version}.` : "";
  return ` The protocol was amended during data collection; participants ran the version they consented under: ${known.map((v) => `version ${v.version} (${v.participants})`).join(", ")}.`;
}

const COUNTERBALANCING: Record<StudyDesign["counterbalancing"]["method"], string> = {
  williams: "a balanced Latin square (Williams 1949), participant i taking row i modulo the number of rows",
  cyclic: "a cyclic Latin square, participant i taking row i modulo the number of rows",
  "all-orders": "all orders of the conditions, assigned in turn",
  random: "an order drawn at random per participant from a recorded seed",
};

const fmt = (x: number): string => (Math.round(x * 100) / 100).toString();
const list = (xs: readonly (string | number)[]): string => (xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} and ${xs.at(-1)}`);

/**
 * A generated methods section (buildMethods), Markdown, for the archive's methods.md.
 *
 * Purpose: a first draft that states design, counterbalancing, task, A×W, ID range, exclusion
 * rule and how We and TP were computed, with citations, so a paper's method section starts from
 * what was really run. The measures follow ISO 9241-411:2012 and Soukoreff & MacKenzie (2004).
 * Cost: O(conditions + A×W).
 * @throws never.
 * @example buildMethods("Gyro study", design, facts).includes("We = 4.133") // true
 */
export function buildMethods(title: string, design: StudyDesign, facts: MethodsFacts): string {
  const t = design.task;
  const factors = design.factors.map((f) => `${f.name} (${list(f.levels.map((l) => l.label))})`);
  const between = design.betweenFactors.map((f) => `${f.name} (${list(f.levels)})`);
  const crossing = design.conditionSubset === null ? "fully crossed" : "in a chosen subset";
  const task =
    t.type === "ring"
      ? `the multi-directional tapping task of ISO 9241-411:2012 (Annex B): ${t.targetsPerRing} targets evenly on a ring, visited so that every movement crosses the ring; A is the chord between successive targets`
      : "the one-directional tapping task of ISO 9241-411:2012: two strips tapped back and forth";
  const idText = facts.idRange ? ` Nominal indices of difficulty ranged from ${fmt(facts.idRange[0])} to ${fmt(facts.idRange[1])} bits` : "";
  const ideText = facts.ideRange ? `${facts.idRange ? "; effective ones" : " Effective indices of difficulty ranged"} from ${fmt(facts.ideRange[0])} to ${fmt(facts.ideRange[1])} bits.` : facts.idRange ? "." : "";
  const exclusion =
    facts.exclude === "misfire"
      ? `Movements were removed as misfires when their distance along the task axis was shorter than A/2 or the selection lay more than 2W from the target centre (common practice); ${facts.excluded} of ${facts.movements} movements (${fmt((100 * facts.excluded) / Math.max(1, facts.movements))} %) were removed. Misses were kept.`
      : `No movements were removed; misses were kept (${facts.movements} movements).`;
  const dropped = facts.sequencesDropped > 0 ? ` ${facts.sequencesDropped} sequence(s) kept fewer than 2 movements and were left out.` : "";
  return [
    `# Methods (generated): ${title}`,
    "",
    "_A draft generated from the study design and the data in this archive. Check it against the protocol before use._",
    "",
    "## Design",
    "",
    `The study had a within-subject design with ${factors.length === 1 ? "the factor" : "the factors"} ${list(factors)}, ${crossing}, giving ${facts.conditions.length} condition${facts.conditions.length === 1 ? "" : "s"} (${list(facts.conditions)})` +
      (between.length ? `, and the between-subject factor${between.length === 1 ? "" : "s"} ${list(between)}.` : ".") +
      ` Each participant ran ${design.blocks} block${design.blocks === 1 ? "" : "s"}; condition order was counterbalanced with ${COUNTERBALANCING[design.counterbalancing.method]}.` +
      ` ${facts.participants} participant${facts.participants === 1 ? "" : "s"} contributed data (${facts.completed} completed the session)${facts.withdrawnLeftOut ? `; ${facts.withdrawnLeftOut} who withdrew are not included` : ""}.` +
      protocolVersionText(facts.protocolVersions ?? []),
    "",
    "## Task",
    "",
    `Participants performed ${task}, in ${t.displayMode === "view" ? "first-person view rotation with a fixed crosshair" : "a 2-D cursor on the screen"} (unit ${facts.unit}), selecting by ${t.selection}.` +
      ` Amplitudes A = ${list(t.amplitudes)} and widths W = ${list(t.widths)} ${facts.unit} were fully crossed (${t.amplitudes.length * t.widths.length} A×W pairs, ${t.sequencesPerAW} sequence${t.sequencesPerAW === 1 ? "" : "s"} each per condition and block, after ${t.practiceSequences} practice sequence${t.practiceSequences === 1 ? "" : "s"} per condition that are not analysed).` +
      `${idText}${ideText}`,
    "",
    "## Measures",
    "",
    `For each movement the selection point was projected onto the task axis from the ${facts.start === "actual" ? "previous selection point (actual start)" : "previous target's centre (nominal start)"} to the target centre (ISO 9241-411:2012; MacKenzie 1992).` +
      ` Per sequence, the effective amplitude Ae is the mean movement distance along the axis, the effective width We = 4.133 · SDx with SDx the sample standard deviation of the end points along the axis (ISO 9241-9:2000 Annex B; Soukoreff & MacKenzie 2004), the effective index of difficulty IDe = log2(Ae/We + 1) (Shannon form, MacKenzie 1992), and throughput TP = IDe/MT with MT the mean movement time.` +
      ` Throughput was averaged over a participant's sequences per condition (the mean of means; Soukoreff & MacKenzie 2004), and all statistics ran on these participant × condition values. ${exclusion}${dropped}${researcherExclusionText(facts.researcherExclusions ?? [])}`,
    "",
    "## Statistics",
    "",
    "Throughput was compared across conditions with a repeated-measures ANOVA (one-way over conditions and factorial over the within-subject factors), with the Greenhouse–Geisser correction for sphericity (Greenhouse & Geisser 1959; Mauchly 1940); effect sizes are partial η². Pairs of conditions were compared with paired t tests, Holm-corrected (Holm 1979), with d_z effect sizes. Error rates were also compared with the Friedman test. Fitts regressions MT = a + b·IDe were fitted over the A×W means per condition.",
    "",
    "## References",
    "",
    "- Greenhouse, S. W., & Geisser, S. (1959). On methods in the analysis of profile data. Psychometrika, 24, 95–112.",
    "- Holm, S. (1979). A simple sequentially rejective multiple test procedure. Scandinavian Journal of Statistics, 6, 65–70.",
    "- ISO 9241-411:2012. Ergonomics of human-system interaction — Part 411: Evaluation methods for the design of physical input devices.",
    "- MacKenzie, I. S. (1992). Fitts' law as a research and design tool in human-computer interaction. Human-Computer Interaction, 7, 91–139.",
    "- Mauchly, J. W. (1940). Significance test for sphericity of a normal n-variate distribution. Annals of Mathematical Statistics, 11, 204–209.",
    "- Soukoreff, R. W., & MacKenzie, I. S. (2004). Towards a standard for pointing device evaluation. International Journal of Human-Computer Studies, 61, 751–789.",
    "- Williams, E. J. (1949). Experimental designs balanced for the estimation of residual effects of treatments. Australian Journal of Scientific Research, 2, 149–168.",
    "",
  ].join("\n");
}
