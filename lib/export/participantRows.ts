import { coarsenAgeBand, coarsenExperience, coarsenHandedness } from "./coarsen";
import type { ExportParticipant } from "./source";

/** The quasi-identifiers of participants.csv that the k-anonymity check groups by. */
export const QUASI_IDENTIFIERS = ["age_band", "handedness", "experience"] as const;

/**
 * The rows of participants.csv (participantRows): pseudonym, status, counterbalancing row,
 * condition order, between factors, final questionnaire coarsened, session length in whole
 * minutes, and dates only when asked for. Keys are the column names.
 * Cost: O(participants).
 * @throws Error "participantRows requires a pseudonym for participant N" when one is missing.
 * @example participantRows([p], new Map([[p.id, "r-01"]]), [], false)[0].participant // "r-01"
 */
export function participantRows(
  participants: readonly ExportParticipant[],
  pseudonyms: ReadonlyMap<number, string>,
  betweenNames: readonly string[],
  includeDates: boolean,
): Record<string, string | number | null>[] {
  return participants.map((p) => {
    const pseudonym = pseudonyms.get(p.id);
    if (pseudonym === undefined) throw new Error(`participantRows requires a pseudonym for participant ${p.id}`);
    const minutes = p.startedAt && p.completedAt ? Math.round((p.completedAt.getTime() - p.startedAt.getTime()) / 60_000) : null;
    const row: Record<string, string | number | null> = {
      participant: pseudonym,
      status: p.status,
      cb_row: p.cbRow,
      condition_order: p.conditionOrder.join(" | "),
      protocol_version: p.protocolVersion ?? null,
      excluded: p.excluded ? 1 : 0,
    };
    for (const b of betweenNames) row[`between_${b}`] = p.betweenLevels[b] ?? null;
    row.age_band = coarsenAgeBand(p.final.ageBand ?? p.final.age_band ?? null);
    row.handedness = coarsenHandedness(p.final.handedness ?? null);
    row.experience = coarsenExperience(p.final.experience ?? null);
    row.session_minutes = minutes;
    if (includeDates) {
      row.started_at = p.startedAt ? p.startedAt.toISOString() : null;
      row.completed_at = p.completedAt ? p.completedAt.toISOString() : null;
    }
    return row;
  });
}
