import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { StudyDesign } from "./design";

/**
 * Design fingerprint (designHash): SHA-256 (hex) of the design's canonical JSON (RFC 8785, via
 * `canonicalize`), so key order never changes it. Stored as studies.design_hash and with every
 * review, so recruitment can check that the approved design is the one that runs.
 *
 * Cost: O(size of the design).
 * @throws Error when the design cannot be serialised.
 * @example designHash(design) // "3f1c…" (64 hex digits)
 */
export function designHash(design: StudyDesign): string {
  const text = canonicalize(design);
  if (text === undefined) throw new Error("designHash requires a JSON-serialisable design");
  return createHash("sha256").update(text, "utf8").digest("hex");
}
