/**
 * Where a participant goes back to on a recruitment panel (returnAddress): the study's return
 * address with `{code}` replaced by the completion code and `{panel_id}` by the panel's
 * participant id, each percent-encoded as a URL component (WHATWG URL); an address without
 * `{code}` gets the code as the query parameter `code` when there is one. Only http and https
 * addresses are used.
 * Cost: O(length). @throws never (null for an address that is not an http(s) URL).
 * @example returnAddress("https://panel.example/done?c={code}", { code: "H4TW9-QC2NB" }) // "https://panel.example/done?c=H4TW9-QC2NB"
 */
export function returnAddress(template: string | null, values: { code?: string | null; panelId?: string | null }): string | null {
  if (!template) return null;
  const hasCode = template.includes("{code}");
  const filled = template.replaceAll("{code}", encodeURIComponent(values.code ?? "")).replaceAll("{panel_id}", encodeURIComponent(values.panelId ?? ""));
  let url: URL;
  try {
    url = new URL(filled);
  } catch {
    return null;
  }
  if (url.protocol !== "https:" && url.protocol !== "http:") return null;
  if (!hasCode && values.code) url.searchParams.set("code", values.code);
  return url.toString();
}
