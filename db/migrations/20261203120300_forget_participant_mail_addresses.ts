import type { Knex } from "knex";

/** Backfill: participant mail logged before (invitations, consent copies) loses its address. */
const PARTICIPANT_TEMPLATES = ["study-invitation", "consent-copy"];

export async function up(knex: Knex): Promise<void> {
  await knex("outgoing_mail").whereIn("template", PARTICIPANT_TEMPLATES).update({ to_address: null });
}

export async function down(): Promise<void> {
  // the addresses are gone for good: nothing to restore
}
