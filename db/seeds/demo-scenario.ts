/**
 * The demo scenario, invented for Yawpoint: the Harbourview Interaction Lab at the fictional
 * Northmere University studies phone gyro aiming. None of these people exist.
 */
export const DEMO_PEOPLE = [
  { email: "admin@harbourview-lab.example", name: "Ines Okafor", role: "admin", password: "demo-admin-harbour" },
  { email: "tomas@harbourview-lab.example", name: "Tomas Lindqvist", role: "researcher", password: "demo-research-tomas" },
  { email: "priya@harbourview-lab.example", name: "Priya Raman", role: "researcher", password: "demo-research-priya" },
  { email: "ethics@harbourview-lab.example", name: "Helen Marsh", role: "reviewer", password: "demo-review-helen" },
] as const;

export const DEMO_STUDY = {
  title: "Phone gyro aiming: CD gain and fine-aim smoothing",
  summary:
    "Does a higher CD gain speed up gyro aiming on a phone without costing accuracy on small targets, and does fine-aim smoothing recover the accuracy? " +
    "Twelve participants point at ISO 9241-411 ring targets by rotating their own phone, in four conditions: gain 2 or 6, smoothing off or on.",
  protocolNumber: "NMU-HREC-2026-117",
  ownerEmail: "tomas@harbourview-lab.example",
  team: [{ email: "priya@harbourview-lab.example", role: "editor" }],
} as const;
