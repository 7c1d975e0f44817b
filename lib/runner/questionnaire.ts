import { conditionsOf, type StudyDesign } from "@/lib/study/design";
import type { Problem } from "./plausibility";
import { FINAL_CHOICES, MAX_COMMENT_CHARS } from "./finalChoices";
import type { QuestionnaireRequest } from "./requests";

/** Which design switch asks each item of the final questionnaire. */
const FINAL_SWITCH = { age_band: "ageBand", handedness: "handedness", experience: "experience" } as const;

/**
 * Why questionnaire answers do not fit the design, or an empty list (answerProblems).
 *
 * Purpose: the server stores only answers to questions the participant was asked: after a
 * condition, each of the design's per-condition rating items (an integer 1..points, no text);
 * at the end (condition ""), the final questionnaire's items the design switches on, each one
 * of the offered choices, the comment as text when comments are asked, or "none" when nothing
 * was asked or answered. Every item once. Rule `questionnaire` names the item.
 * Source: the study design (lib/study/design.ts); Likert scales of 5 or 7 points (common practice).
 * Cost: O(items).
 * @throws never.
 * @example answerProblems(design, { condition: "", answers: [{ itemId: "age_band", valueInt: null, valueText: "25–34" }] }) // []
 */
export function answerProblems(design: StudyDesign, input: QuestionnaireRequest): Problem[] {
  const problems: Problem[] = [];
  const bad = (message: string) => problems.push({ rule: "questionnaire", message });
  const seen = new Set<string>();
  for (const a of input.answers) {
    if (seen.has(a.itemId)) bad(`${a.itemId}: answered twice`);
    seen.add(a.itemId);
  }
  if (input.condition !== "") {
    if (!conditionsOf(design).some((c) => c.label === input.condition)) {
      bad(`unknown condition "${input.condition}"`);
      return problems;
    }
    for (const a of input.answers) {
      const item = design.perConditionItems.find((i) => i.id === a.itemId);
      if (!item) bad(`${a.itemId}: not an item of this study's questionnaire`);
      else if (a.valueText !== null || a.valueInt === null || a.valueInt < 1 || a.valueInt > item.points) bad(`${a.itemId}: must be a rating from 1 to ${item.points}`);
    }
    return problems;
  }
  const ask = design.finalQuestionnaire;
  for (const a of input.answers) {
    if (a.itemId === "none") {
      if (a.valueInt !== null || a.valueText !== null || input.answers.length > 1) bad("none: stands alone and carries no value");
    } else if (a.itemId === "comments") {
      if (!ask.comments) bad("comments: this study asks for no comments");
      else if (a.valueInt !== null || a.valueText === null || a.valueText.length > MAX_COMMENT_CHARS) bad(`comments: must be text of at most ${MAX_COMMENT_CHARS} characters`);
    } else if (a.itemId in FINAL_CHOICES) {
      const id = a.itemId as keyof typeof FINAL_CHOICES;
      const choices: readonly string[] = FINAL_CHOICES[id];
      if (!ask[FINAL_SWITCH[id]]) bad(`${id}: this study does not ask it`);
      else if (a.valueInt !== null || a.valueText === null || !choices.includes(a.valueText)) bad(`${id}: must be one of ${choices.join(", ")}`);
    } else bad(`${a.itemId}: not an item of the final questionnaire`);
  }
  return problems;
}
