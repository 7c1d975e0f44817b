import { env } from "@/lib/env";
import type { FakeMessage } from "./fake-message";

/** Messages the local SMTP fake holds (development and tests). */
export async function fetchFakeMessages(): Promise<FakeMessage[]> {
  const res = await fetch(`http://127.0.0.1:${env.MAIL_FAKE_HTTP_PORT}/messages`, { cache: "no-store", signal: AbortSignal.timeout(3000) });
  if (!res.ok) throw new Error(`mail fake answered ${res.status}`);
  return (await res.json()) as FakeMessage[];
}

/** The single-use links that act for their recipient: choosing a password (/reset/<token>), a participant's own session (/s/<token>). */
const PERSONAL_LINK = /(\/(?:reset|s)\/)(?!public\/)[A-Za-z0-9_-]{16,}/g;

/**
 * The messages as an admin may read them (messagesForViewer): a link that acts for its recipient
 * — a password link, a participant's session link — shows only in messages to the viewer, so the
 * admin of a demo cannot take over another account or session from the mail page.
 * Cost: O(text). @throws never.
 * @example messagesForViewer([{ to: ["a@x"], text: "…/reset/AbC…" , …}], "admin@x")[0].text // "…/reset/[hidden: only its recipient may use it]"
 */
export function messagesForViewer(messages: readonly FakeMessage[], viewerEmail: string): FakeMessage[] {
  const me = viewerEmail.trim().toLowerCase();
  return messages.map((m) => {
    if (m.to.some((t) => t.toLowerCase() === me)) return m;
    const hide = (s: string) => s.replace(PERSONAL_LINK, "$1[hidden: only its recipient may use it]");
    return { ...m, text: hide(m.text), html: m.html === null ? null : hide(m.html) };
  });
}
