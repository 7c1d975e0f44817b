export { sha256Text } from "./sha256Text";
export { CONSENT_ELEMENTS, type ConsentElement } from "./consentElements";
export { consentChecklist, missingConsentElements, type ConsentChecklistItem } from "./consentChecklist";
export { consentDiff, type DiffPart } from "./consentDiff";
export { consentBodySchema, type ConsentBodyInput } from "./schema";
