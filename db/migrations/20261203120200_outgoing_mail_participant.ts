import type { Knex } from "knex";

/**
 * Participant mail is logged without an address: the participant's id instead (purged on
 * withdrawal and erasure). Staff mail (resets, account invitations) keeps its address.
 * The backfill of old rows is the next migration's.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("outgoing_mail", (t) => {
    t.integer("participant_id").unsigned().nullable().references("id").inTable("participants").onDelete("CASCADE")
      .comment("set for participant mail, which never logs an address");
    t.string("to_address", 254).nullable().alter().comment("staff mail only; null for participant mail");
    t.index(["participant_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex("outgoing_mail").whereNull("to_address").update({ to_address: "(participant)" });
  await knex.schema.alterTable("outgoing_mail", (t) => {
    t.dropForeign(["participant_id"]);
    t.dropIndex(["participant_id"]);
    t.dropColumn("participant_id");
    t.string("to_address", 254).notNullable().alter();
  });
}
