import type { ExclusionCounts } from "../analysis/applyExclusions";
import type { ExclusionRule } from "../analysis/options";
import type { MissingReport } from "../analysis/result";
import type { StudyDesign } from "../study/design";

/** Who took part, counted over everyone who agreed to (real participants and included pilots). */
export interface RecruitmentCounts {
  /** Consented (everyone past the invitation), withdrawn ones included. */
  recruited: number;
  withdrawn: number;
  /** Of the withdrawn, those whose data were erased at their request. */
  erased: number;
}

/** What the methods paragraph needs beyond the design. */
export interface MethodsFacts {
  /** Participants in the archive (consented, not withdrawn). */
  participants: number;
  /** Of them, those with at least one analysed movement. */
  withData?: number;
  completed: number;
  /** Recruitment as a whole; without it the paragraph says only who is in the archive. */
  recruitment?: RecruitmentCounts;
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
  /** Movements removed by each rule (their sum is `excluded`). */
  exclusionCounts?: ExclusionCounts;
  /** Flags whose movements were removed (timed_out, recentered, clutched). */
  dropFlagged?: string[];
  /** Time-outs kept and counted as errors. */
  timeoutsKept?: number;
  /** Why sequences were left out, with how many each. */
  sequencesDroppedReasons?: { reason: string; sequences: number }[];
  /** Participants left out of the tests for lacking a condition. */
  missing?: Pick<MissingReport, "participantsExcluded" | "participantsIncluded" | "participants">;
  /** plane: coordinates on the screen; sphere: view directions (view mode). */
  geometry?: "plane" | "sphere";
  /** Movements with path accuracy measures (from the raw streams). */
  pathMovements?: number;
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
const plural = (n: number, one: string, many = `${one}s`): string => `${n} ${n === 1 ? one : many}`;

/**
 * Who took part (participationText): recruited, withdrawn (and erased), in the archive, completed
 * and with analysed data, every figure from the data; without recruitment counts only the archive's.
 * Cost: O(1). @throws never.
 * @example participationText({ participants: 11, completed: 10, recruitment: { recruited: 12, withdrawn: 1, erased: 0 } } as MethodsFacts) // " 12 people consented to take part; 1 withdrew and is not included. Of the 11 remaining, 10 completed the session."
 */
export function participationText(facts: Pick<MethodsFacts, "participants" | "completed" | "recruitment" | "withData">): string {
  const r = facts.recruitment;
  const withData = facts.withData !== undefined && facts.withData !== facts.participants ? ` ${plural(facts.participants - facts.withData, "of them has", "of them have")} no analysed movement.` : "";
  if (!r) return ` ${plural(facts.participants, "participant")} ${facts.participants === 1 ? "is" : "are"} in this archive (${facts.completed} completed the session).${withData}`;
  const withdrew = `${r.withdrawn} withdrew${r.erased ? ` (${r.erased} of them asked for their data to be erased)` : ""} and ${r.withdrawn === 1 ? "is" : "are"} not included`;
  if (r.withdrawn === 0) return ` ${plural(r.recruited, "person", "people")} consented to take part and none withdrew; ${facts.completed} completed the session.${withData}`;
  return ` ${plural(r.recruited, "person", "people")} consented to take part; ${withdrew}. Of the ${facts.participants} remaining, ${facts.completed} completed the session.${withData}`;
}

const RULE_TEXT = {
  misfire: "as misfires when their distance along the task axis was shorter than A/2 or the selection lay more than 2W from the target centre (common practice)",
  mt3sd: "as outliers when their movement time lay more than 3 standard deviations from the mean of their participant × condition cell (common practice)",
} as const;

/**
 * What the exclusion rules removed (exclusionText), with the count per rule, flags and kept time-outs.
 * Cost: O(1). @throws never.
 * @example exclusionText({ exclude: "misfire", excluded: 3, movements: 300, exclusionCounts: { misfire: 3, mt3sd: 0, timed_out: 0, recentered: 0, clutched: 0 } } as MethodsFacts) // "Movements were removed as misfires when … (common practice): 3. In all 3 of 300 movements (1 %) were removed; misses were kept."
 */
export function exclusionText(facts: Pick<MethodsFacts, "exclude" | "excluded" | "movements" | "exclusionCounts" | "dropFlagged" | "timeoutsKept">): string {
  const c = facts.exclusionCounts;
  const parts: string[] = [];
  for (const flag of facts.dropFlagged ?? []) {
    const n = c ? c[flag as keyof typeof c] : undefined;
    parts.push(`Movements during which the participant ${flag === "timed_out" ? "ran out of time" : flag === "recentered" ? "recentred" : "used the clutch"} were removed${n === undefined ? "" : ` (${n})`}.`);
  }
  if (facts.exclude === "misfire" || facts.exclude === "misfire+mt3sd") parts.push(`Movements were removed ${RULE_TEXT.misfire}${c ? `: ${c.misfire}` : ""}.`);
  if (facts.exclude === "mt3sd" || facts.exclude === "misfire+mt3sd") {
    parts.push(`${facts.exclude === "misfire+mt3sd" ? "Of the movements that remained, those" : "Movements"} were removed ${RULE_TEXT.mt3sd}${c ? `: ${c.mt3sd}` : ""}.`);
  }
  if (facts.exclude === "none" && (facts.dropFlagged ?? []).length === 0) parts.push("No exclusion rule was applied.");
  parts.push(`In all ${facts.excluded} of ${facts.movements} movements (${fmt((100 * facts.excluded) / Math.max(1, facts.movements))} %) were removed; misses were kept${facts.timeoutsKept ? `, and ${plural(facts.timeoutsKept, "movement")} ended by the time limit ${facts.timeoutsKept === 1 ? "was" : "were"} kept and counted as errors` : ""}.`);
  return parts.join(" ");
}

/**
 * Sequences and participants left out (leftOutText): each sequence reason with its count, and the
 * participants left out of the inferential tests for lacking a condition, with why.
 * Cost: O(reasons + participants). @throws never.
 * @example leftOutText({ sequencesDropped: 0, missing: { participantsExcluded: 1, participantsIncluded: 11, participants: [{ participant: "P3", reason: "no value in stick-6" }] } } as MethodsFacts) // " 1 participant lacked a value in some condition and was left out of the ANOVA, the post hoc tests and the Friedman test (11 remained): P3 (no value in stick-6)."
 */
export function leftOutText(facts: Pick<MethodsFacts, "sequencesDropped" | "sequencesDroppedReasons" | "missing">): string {
  let out = "";
  if (facts.sequencesDropped > 0) {
    const reasons = facts.sequencesDroppedReasons ?? [];
    out += ` ${plural(facts.sequencesDropped, "sequence")} ${facts.sequencesDropped === 1 ? "was" : "were"} left out of every summary${reasons.length ? `: ${reasons.map((r) => `${r.reason} (${r.sequences})`).join("; ")}` : ""}.`;
  }
  const m = facts.missing;
  if (m && m.participantsExcluded > 0) {
    const shown = m.participants.slice(0, 10).map((p) => `${p.participant} (${p.reason})`);
    const more = m.participants.length > shown.length ? `, and ${m.participants.length - shown.length} more` : "";
    out += ` ${plural(m.participantsExcluded, "participant")} lacked a value in some condition and ${m.participantsExcluded === 1 ? "was" : "were"} left out of the ANOVA, the post hoc tests and the Friedman test (${m.participantsIncluded} remained): ${shown.join("; ")}${more}.`;
  } else if (m) {
    out += ` Every participant had a value in every condition, so all ${m.participantsIncluded} entered the tests.`;
  }
  return out;
}

/**
 * The statistics paragraph (statisticsText): within-subject or mixed design, the corrections and
 * when they cannot be computed, post hoc families, and the rule for values that cannot be computed.
 * Cost: O(factors). @throws never.
 */
export function statisticsText(design: StudyDesign): string {
  const mixed = design.betweenFactors.length > 0;
  const anova = mixed
    ? `Throughput was compared with a mixed-design ANOVA (Type III sums of squares, so unequal groups are allowed) with the between-subject factor${design.betweenFactors.length === 1 ? "" : "s"} ${list(design.betweenFactors.map((f) => f.name))} and the within-subject condition factors: between effects were tested against the variation of participants within groups, within effects and their interactions with between factors against their own effect × participants-within-groups error.`
    : "Throughput was compared across conditions with a repeated-measures ANOVA (one-way over conditions and factorial over the within-subject factors), each effect against its own effect × participant error.";
  const sphericity =
    " For within effects with more than one degree of freedom, Mauchly's test (Mauchly 1940) and the Greenhouse–Geisser (Greenhouse & Geisser 1959) and Huynh–Feldt (Huynh & Feldt 1976, in the form of Lecoutre 1991) corrections are reported" +
    (mixed ? ", from the within-group covariance of the contrasts pooled over groups" : "") +
    "; where there are fewer error degrees of freedom than levels minus one, that covariance is singular, so neither the test nor the corrections can be computed: they are reported as not computable and the conservative lower-bound correction (ε = 1/(k − 1)) is given instead. Effect sizes are partial and generalised η² (Olejnik & Algina 2003).";
  const posthoc = mixed
    ? " Pairs of conditions were compared with paired t tests over all participants and within each group, and groups with Welch's t test in each condition (Welch 1947); each family was Holm-corrected (Holm 1979), counting every planned comparison, with d_z (paired) and d (between groups) as effect sizes."
    : " Pairs of conditions were compared with paired t tests, Holm-corrected (Holm 1979) counting every planned comparison, with d_z effect sizes.";
  return (
    anova +
    sphericity +
    posthoc +
    " Error rates were also compared with the Friedman test. Fitts regressions MT = a + b·IDe were fitted over the A×W means per condition. A value that cannot be computed is reported as not computable with its reason, never as a number, and is never averaged."
  );
}

/** The geometry sentence for view mode (sphereText): our convention, stated. */
function sphereText(geometry: MethodsFacts["geometry"]): string {
  return geometry === "sphere"
    ? " Start, target and selection are view directions, taken as points on the unit sphere: A is the great-circle angle from start to target, dx the signed angle from the target to the selection's projection onto the great circle through start and target (+ beyond the target), and |P − T| the great-circle angle between selection and target (spherical geometry; a convention of this tool)."
    : "";
}

/** The path accuracy sentence (pathText): how many movements had measures from their streams. */
function pathText(pathMovements: number | undefined, task: StudyDesign["task"]["type"]): string {
  return pathMovements
    ? ` Path accuracy (target re-entry, task axis crossing, movement and orthogonal direction change, movement variability, error and offset; MacKenzie, Kauppinen & Silfverberg 2001) was computed for ${pathMovements} movements from the raw sensor streams, replayed through each condition's configuration with the participant's calibration; a change counts only beyond a band of 0.05·W, so sensor noise does not count.${task === "ring" ? "" : " The strips' geometry applies: a strip is long across the task axis, so re-entry counts the distance along the axis only."}`
    : "";
}

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
  return [
    `# Methods (generated): ${title}`,
    "",
    "_A draft generated from the study design and the data in this archive. Check it against the protocol before use._",
    "",
    "## Design",
    "",
    `The study had a ${between.length ? "mixed" : "within-subject"} design with ${between.length ? "the within-subject" : "the"} ${factors.length === 1 ? "factor" : "factors"} ${list(factors)}, ${crossing}, giving ${facts.conditions.length} condition${facts.conditions.length === 1 ? "" : "s"} (${list(facts.conditions)})` +
      (between.length ? `, and the between-subject factor${between.length === 1 ? "" : "s"} ${list(between)}.` : ".") +
      ` Each participant ran ${design.blocks} block${design.blocks === 1 ? "" : "s"}; condition order was counterbalanced with ${COUNTERBALANCING[design.counterbalancing.method]}.` +
      participationText(facts) +
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
    `For each movement the selection point was projected onto the task axis from the ${facts.start === "actual" ? "previous selection point (actual start)" : "previous target's centre (nominal start)"} to the target centre (ISO 9241-411:2012; MacKenzie 1992).${sphereText(facts.geometry)}` +
      ` Per sequence, the effective amplitude Ae is the mean movement distance along the axis, the effective width We = 4.133 · SDx with SDx the sample standard deviation of the end points along the axis (ISO 9241-9:2000 Annex B; Soukoreff & MacKenzie 2004), the effective index of difficulty IDe = log2(Ae/We + 1) (Shannon form, MacKenzie 1992), and throughput TP = IDe/MT with MT the mean movement time.` +
      ` Throughput was averaged over a participant's sequences per condition (the mean of means; Soukoreff & MacKenzie 2004), and all statistics ran on these participant × condition values. ${exclusionText(facts)}${leftOutText(facts)}${researcherExclusionText(facts.researcherExclusions ?? [])}${pathText(facts.pathMovements, t.type)}`,
    "",
    "## Statistics",
    "",
    statisticsText(design),
    "",
    "## References",
    "",
    "- Greenhouse, S. W., & Geisser, S. (1959). On methods in the analysis of profile data. Psychometrika, 24, 95–112.",
    "- Holm, S. (1979). A simple sequentially rejective multiple test procedure. Scandinavian Journal of Statistics, 6, 65–70.",
    "- Huynh, H., & Feldt, L. S. (1976). Estimation of the Box correction for degrees of freedom from sample data in randomized block and split-plot designs. Journal of Educational Statistics, 1, 69–82.",
    "- ISO 9241-411:2012. Ergonomics of human-system interaction — Part 411: Evaluation methods for the design of physical input devices.",
    "- Lecoutre, B. (1991). A correction for the ε̃ approximate test in repeated measures designs with two or more independent groups. Journal of Educational Statistics, 16, 371–372.",
    "- MacKenzie, I. S. (1992). Fitts' law as a research and design tool in human-computer interaction. Human-Computer Interaction, 7, 91–139.",
    "- MacKenzie, I. S., Kauppinen, T., & Silfverberg, M. (2001). Accuracy measures for evaluating computer pointing devices. Proceedings of CHI 2001, 9–16.",
    "- Mauchly, J. W. (1940). Significance test for sphericity of a normal n-variate distribution. Annals of Mathematical Statistics, 11, 204–209.",
    "- Olejnik, S., & Algina, J. (2003). Generalized eta and omega squared statistics. Psychological Methods, 8, 434–447.",
    "- Soukoreff, R. W., & MacKenzie, I. S. (2004). Towards a standard for pointing device evaluation. International Journal of Human-Computer Studies, 61, 751–789.",
    "- Welch, B. L. (1947). The generalization of \"Student's\" problem when several different population variances are involved. Biometrika, 34, 28–35.",
    "- Williams, E. J. (1949). Experimental designs balanced for the estimation of residual effects of treatments. Australian Journal of Scientific Research, 2, 149–168.",
    "",
  ].join("\n");
}
