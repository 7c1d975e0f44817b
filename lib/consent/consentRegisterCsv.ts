import { csvLine } from "../csv/csvField";

/** A consent record as the register lists it (the typed name already decrypted). */
export type ConsentRegisterLine = {
  participantCode: string; status: string; version: number; versionHash: string; documentHash: string | null;
  signedAt: Date; withdrawnAt: Date | null; erasedAt: Date | null; typedName: string | null; agreed: string[];
};

export const CONSENT_REGISTER_HEADER = ["participant_code", "status", "consent_version", "version_hash", "document_sha256", "signed_at", "withdrawn_at", "typed_name", "agreed", "erased_at"] as const;

/**
 * The identified consent register as CSV (consentRegisterCsv): one line per consent record, "\n"
 * line ends. Written through csvLine, so a typed name such as `=HYPERLINK(…)` stays text in a
 * spreadsheet (OWASP CSV Injection). Times in ISO 8601 UTC.
 * Cost: O(records). @throws never.
 * @example consentRegisterCsv([]) // "participant_code,status,…,erased_at\n"
 */
export function consentRegisterCsv(records: readonly ConsentRegisterLine[]): string {
  const iso = (d: Date | null) => (d ? d.toISOString() : null);
  const lines = [csvLine(CONSENT_REGISTER_HEADER), ...records.map((r) => csvLine([
    r.participantCode, r.status, r.version, r.versionHash, r.documentHash, r.signedAt.toISOString(), iso(r.withdrawnAt), r.typedName, r.agreed.join(" "), iso(r.erasedAt),
  ]))];
  return lines.join("\n") + "\n";
}
