import canonicalize from "canonicalize";

/** Everything an ethics review approves about a study: what participants read, what they do, what they are sent. */
export interface ProtocolContent {
  title: string;
  /** The information page's text. */
  summary: string;
  /** The stored design (any JSON value); compared by its canonical form. */
  design: unknown;
  consentBody: string | null;
  invitationText: string | null;
  erasureWindowDays: number | null;
}

/** One part of a protocol that differs, as texts to diff (DiffView). */
export interface ProtocolChange {
  part: "title" | "information" | "design" | "consent" | "invitation" | "erasure window";
  before: string;
  after: string;
}

/**
 * A design as text for a line diff (designText): the canonical JSON (RFC 8785 key order, via
 * `canonicalize`) pretty-printed two spaces deep, so the same design always reads the same.
 * Cost: O(size). @throws never. @example designText({ b: 1, a: 2 }) // "{\n  \"a\": 2,\n  \"b\": 1\n}\n"
 */
export function designText(design: unknown): string {
  if (design === null || design === undefined) return "(no design saved)\n";
  const canonical = canonicalize(design);
  return canonical === undefined ? "(not serialisable)\n" : `${JSON.stringify(JSON.parse(canonical) as unknown, null, 2)}\n`;
}

const windowText = (days: number | null): string => (days === null ? "no limit stated\n" : `${days} days after the session\n`);

/**
 * The parts in which a working copy differs from an approved protocol version (protocolChanges),
 * in the order a reviewer reads them: title, information, design, consent, invitation, erasure
 * window. An empty list means nothing needs a new review.
 * Cost: O(size of both). @throws never.
 * @example protocolChanges(approved, { ...approved, title: "New" }).map((c) => c.part) // ["title"]
 */
export function protocolChanges(approved: ProtocolContent, working: ProtocolContent): ProtocolChange[] {
  const changes: ProtocolChange[] = [];
  const text = (s: string | null) => (s ?? "").replace(/\r\n?/g, "\n");
  if (approved.title.trim() !== working.title.trim()) changes.push({ part: "title", before: `${approved.title}\n`, after: `${working.title}\n` });
  if (text(approved.summary).trim() !== text(working.summary).trim()) changes.push({ part: "information", before: text(approved.summary), after: text(working.summary) });
  const [d0, d1] = [designText(approved.design), designText(working.design)];
  if (d0 !== d1) changes.push({ part: "design", before: d0, after: d1 });
  if (text(approved.consentBody) !== text(working.consentBody)) changes.push({ part: "consent", before: text(approved.consentBody), after: text(working.consentBody) });
  if (text(approved.invitationText).trim() !== text(working.invitationText).trim()) changes.push({ part: "invitation", before: text(approved.invitationText), after: text(working.invitationText) });
  if (approved.erasureWindowDays !== working.erasureWindowDays) changes.push({ part: "erasure window", before: windowText(approved.erasureWindowDays), after: windowText(working.erasureWindowDays) });
  return changes;
}
