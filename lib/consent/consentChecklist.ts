import { CONSENT_ELEMENTS } from "./consentElements";

export type ConsentChecklistItem = { id: string; label: string; basis: string; present: boolean };

/**
 * Consent checklist (consentChecklist): which of the required elements a consent text mentions.
 * A keyword check, not a judgement: it flags what seems missing so the researcher looks again.
 *
 * Source: 45 CFR 46.116(b) basic elements (see CONSENT_ELEMENTS). Cost: O(text × patterns).
 * @throws never.
 * @example consentChecklist("## Purpose\nWe study aiming.").filter((i) => i.present).map((i) => i.id) // ["purpose"]
 */
export function consentChecklist(markdown: string): ConsentChecklistItem[] {
  return CONSENT_ELEMENTS.map((e) => ({ id: e.id, label: e.label, basis: e.basis, present: e.patterns.some((p) => p.test(markdown)) }));
}

/** The labels of the elements consentChecklist finds missing. */
export function missingConsentElements(markdown: string): string[] {
  return consentChecklist(markdown).filter((i) => !i.present).map((i) => i.label);
}
