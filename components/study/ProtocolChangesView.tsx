import { consentDiff } from "@/lib/consent/consentDiff";
import type { ProtocolChange } from "@/lib/study/protocolChanges";
import { DiffView } from "./DiffView";

const PART_TITLE: Record<ProtocolChange["part"], string> = {
  title: "Title",
  information: "Information shown to participants",
  design: "Design",
  consent: "Consent text",
  invitation: "Invitation text",
  "erasure window": "Erasure window",
};

/** The parts of a protocol that differ from the approved version, each as a line diff. */
export function ProtocolChangesView({ changes, baseline }: { changes: ProtocolChange[]; baseline: string }) {
  if (changes.length === 0) return <p className="text-sm">Nothing differs from {baseline}.</p>;
  return (
    <div className="space-y-3" data-testid="protocol-changes">
      <p className="text-sm">Changed since {baseline}: {changes.map((c) => PART_TITLE[c.part].toLowerCase()).join(", ")}.</p>
      {changes.map((c) => (
        <div key={c.part} className="space-y-1">
          <h3 className="font-semibold">{PART_TITLE[c.part]}</h3>
          <DiffView label={`${PART_TITLE[c.part]}: diff to ${baseline}`} parts={consentDiff(c.before, c.after)} />
        </div>
      ))}
    </div>
  );
}
