/**
 * The elements a consent document is checked for. The list follows the basic elements of
 * informed consent in the US Common Rule, 45 CFR 46.116(b) (paragraph numbers from memory), with
 * the cautions this kind of study needs (wrist strain, motion sickness, flashing). The local
 * ethics board's own requirements come first; the checklist only helps.
 */
export type ConsentElement = {
  id: string;
  label: string;
  /** where the element comes from, shown beside it */
  basis: string;
  /** any of these (case-insensitive) counts as the element being present */
  patterns: RegExp[];
};

export const CONSENT_ELEMENTS: readonly ConsentElement[] = [
  { id: "purpose", label: "Purpose of the research", basis: "45 CFR 46.116(b)(1)", patterns: [/\bpurpose\b/i, /\bwhy we\b/i, /\baims? of (this|the) (study|research)\b/i] },
  { id: "procedures", label: "What participants will do (procedures)", basis: "45 CFR 46.116(b)(1)", patterns: [/\bprocedures?\b/i, /\bwhat (you will|you'll) do\b/i, /\bwhat happens\b/i] },
  { id: "duration", label: "Expected duration", basis: "45 CFR 46.116(b)(1)", patterns: [/\bduration\b/i, /\b\d+\s*(minutes?|min|hours?)\b/i, /\bhow long\b/i] },
  { id: "risks", label: "Risks and discomforts", basis: "45 CFR 46.116(b)(2)", patterns: [/\brisks?\b/i, /\bdiscomforts?\b/i] },
  { id: "risk-wrist", label: "Risk: wrist or hand strain from repeated rotation", basis: "45 CFR 46.116(b)(2); common practice for motion aiming", patterns: [/\bwrist\b/i, /\bhand strain\b/i] },
  { id: "risk-motion-sickness", label: "Risk: motion sickness from view rotation", basis: "45 CFR 46.116(b)(2); common practice for view rotation", patterns: [/\bmotion sickness\b/i, /\bnause/i, /\bdizz/i] },
  { id: "risk-flashing", label: "Risk: flashing highlights (photosensitivity)", basis: "45 CFR 46.116(b)(2); common practice for flashing displays", patterns: [/\bflash/i, /\bphotosensitiv/i] },
  { id: "benefits", label: "Benefits", basis: "45 CFR 46.116(b)(3)", patterns: [/\bbenefits?\b/i] },
  { id: "compensation", label: "Compensation", basis: "45 CFR 46.116(b)(6) (injury); payment is common practice", patterns: [/\bcompensat/i, /\bpayment\b/i, /\breward\b/i, /\bvoucher\b/i] },
  { id: "confidentiality", label: "Confidentiality and data handling", basis: "45 CFR 46.116(b)(5), (b)(9)", patterns: [/\bconfidential/i, /\bdata (handling|protection|storage)\b/i, /\bprivacy\b/i, /\bpseudonym/i, /\banonymi[sz]/i] },
  { id: "voluntary", label: "Voluntary participation and withdrawal", basis: "45 CFR 46.116(b)(8)", patterns: [/\bvoluntar/i] },
  { id: "withdrawal", label: "How to withdraw at any time", basis: "45 CFR 46.116(b)(8)", patterns: [/\bwithdraw/i, /\bstop at any (time|moment)\b/i] },
  { id: "contacts", label: "Whom to contact (researchers and the ethics board)", basis: "45 CFR 46.116(b)(7)", patterns: [/\bcontact\b/i, /[\w.+-]+@[\w-]+\.[\w.]+/] },
];
