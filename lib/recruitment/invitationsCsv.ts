/** The CSV a researcher downloads after making links in bulk (RFC 4180 quoting; codes and links need none). */
export function invitationsCsv(rows: { code: string; link: string; completionCode: string }[]): string {
  const quote = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s);
  return ["participant,link,completion_code", ...rows.map((r) => [r.code, r.link, r.completionCode].map(quote).join(","))].join("\r\n") + "\r\n";
}
