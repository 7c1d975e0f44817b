/** A block of a consent document as the runner shows it. */
export type ConsentBlock =
  | { kind: "heading"; text: string }
  | { kind: "paragraph"; text: string }
  | { kind: "item"; text: string }
  | { kind: "statement"; id: string; text: string };

/** The statement shown when a document has none of its own. */
export const DEFAULT_STATEMENT = "I have read the information above and agree to take part.";

/**
 * A consent document split into blocks, with its required statements (consentBlocks).
 *
 * Purpose: the runner shows the approved version's text without a Markdown library (a small
 * participant bundle): headings (#), list items (- or *), paragraphs; a task-list item
 * "- [ ] text" is a statement the participant must tick, numbered s1, s2, … in document order.
 * A document without statements gets one ({@link DEFAULT_STATEMENT}, id "s1").
 * Source: CommonMark headings, lists and the GitHub task-list convention. Cost: O(length).
 * @throws never.
 * @example consentBlocks("# Study\n\n- [ ] I agree").map((b) => b.kind) // ["heading", "statement"]
 */
export function consentBlocks(markdown: string): ConsentBlock[] {
  const blocks: ConsentBlock[] = [];
  let paragraph: string[] = [];
  let statements = 0;
  const flush = (): void => {
    if (paragraph.length > 0) blocks.push({ kind: "paragraph", text: paragraph.join(" ") });
    paragraph = [];
  };
  for (const raw of markdown.replace(/\r\n?/g, "\n").split("\n")) {
    const line = raw.trim();
    const task = /^[-*]\s+\[[ xX]?\]\s+(.+)$/.exec(line);
    const heading = /^#{1,6}\s+(.+)$/.exec(line);
    const item = /^(?:[-*]|\d+\.)\s+(.+)$/.exec(line);
    if (line === "") flush();
    else if (task) {
      flush();
      blocks.push({ kind: "statement", id: `s${++statements}`, text: task[1]! });
    } else if (heading) {
      flush();
      blocks.push({ kind: "heading", text: heading[1]! });
    } else if (item) {
      flush();
      blocks.push({ kind: "item", text: item[1]! });
    } else paragraph.push(line);
  }
  flush();
  if (statements === 0) blocks.push({ kind: "statement", id: "s1", text: DEFAULT_STATEMENT });
  return blocks;
}

/** The ids of the statements a participant must tick. */
export function requiredStatementIds(markdown: string): string[] {
  return consentBlocks(markdown).flatMap((b) => (b.kind === "statement" ? [b.id] : []));
}

/** The text of the consent copy sent by e-mail (our own wording). */
export function consentCopyText(p: { studyTitle: string; version: number; hash: string; signedAt: Date; body: string; withdrawLink: string; participantCode?: string }): { subject: string; text: string } {
  return {
    subject: `Your copy of the consent for "${p.studyTitle}"`,
    text: [
      `You agreed to take part in "${p.studyTitle}" on ${p.signedAt.toISOString()} (consent version ${p.version}).`,
      ...(p.participantCode ? [`Your participant code: ${p.participantCode}. Quote it if you ask the research team to erase your data.`] : []),
      `Fingerprint of the text you agreed to (SHA-256): ${p.hash}`,
      "",
      "You may stop at any time, without giving a reason. To stop, open your session link and choose \"Stop and withdraw\":",
      p.withdrawLink,
      "",
      "----- The consent text -----",
      p.body,
      "",
      "This address is not stored with your study data; it was used only to send you this copy.",
    ].join("\n"),
  };
}
