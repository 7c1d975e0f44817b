import { csvLine } from "../csv/csvField";

/** The CSV a researcher downloads after making links in bulk (RFC 4180 quoting, formula triggers neutralised: lib/csv). */
export function invitationsCsv(rows: { code: string; link: string; completionCode: string }[]): string {
  return [csvLine(["participant", "link", "completion_code"]), ...rows.map((r) => csvLine([r.code, r.link, r.completionCode]))].join("\r\n") + "\r\n";
}
