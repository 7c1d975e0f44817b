export { newShortCode, normaliseShortCode, SHORT_CODE_LENGTH, SHORT_CODE_PATTERN } from "./shortCode";
export { qrSvg, qrDataUrl } from "./qrSvg";
