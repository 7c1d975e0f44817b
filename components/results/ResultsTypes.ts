import type { ResultsView } from "@/lib/results";

/** GET /api/studies/[id]/results */
export type ResultsResponse = {
  study: { id: number; title: string; status: string };
  hasDesign: boolean;
  results: ResultsView | null;
  computedAt: string;
};

export const fetchJson = async <T,>(url: string): Promise<T> => {
  const res = await fetch(url, { cache: "no-store" });
  const body = (await res.json()) as T & { error?: { message: string } };
  if (!res.ok) throw new Error(body.error?.message ?? `HTTP ${res.status}`);
  return body;
};
