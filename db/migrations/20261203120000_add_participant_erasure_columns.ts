import type { Knex } from "knex";

/**
 * What erasure and withdrawal need on the participant rows (lib/data/erasure.ts): the time of
 * erasure on the participant and on the consent record (both stay as non-identifying
 * tombstones), the participant's own withdrawal reason (kept apart from the audit log, which can
 * never be erased) and a consent record whose device summary can be removed.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participants", (t) => {
    t.dateTime("erased_at", { precision: 3 }).nullable().comment("set when every row of the participant was erased; the row stays as a tombstone without identifying fields");
    t.string("withdrawal_reason", 500).nullable().comment("the participant's own words on withdrawing; erased with the participant, never audit-logged");
  });
  await knex.schema.alterTable("consent_records", (t) => {
    t.json("device_summary").nullable().alter();
    t.dateTime("erased_at", { precision: 3 }).nullable().comment("set when the participant was erased: the record keeps only version, hash, statements and the day of signing");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex("consent_records").whereNull("device_summary").update({ device_summary: JSON.stringify({}) });
  await knex.schema.alterTable("consent_records", (t) => {
    t.dropColumn("erased_at");
    t.json("device_summary").notNullable().alter();
  });
  await knex.schema.alterTable("participants", (t) => {
    t.dropColumn("withdrawal_reason");
    t.dropColumn("erased_at");
  });
}
