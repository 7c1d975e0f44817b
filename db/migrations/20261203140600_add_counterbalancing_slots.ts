import type { Knex } from "knex";

/**
 * Counterbalancing with replacement: a participant takes a place (slot) when their first task
 * sequence starts; slot s is row s mod rows (and between-subject group ⌊s / rows⌋ mod groups). A
 * place is released on a device-check refusal, a withdrawal or inactivity, and the next
 * participant takes the first free one.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participants", (t) => {
    t.integer("cb_slot").unsigned().nullable().comment("place in the counterbalancing sequence (0-based): row = slot mod rows");
    t.dateTime("cb_released_at", { precision: 3 }).nullable().comment("when the participant stopped holding their place and counting toward the cap");
    t.enum("cb_release_reason", ["device", "withdrawn", "inactive"]).nullable().comment("device: refused by the device check; withdrawn; inactive: no activity for the study's inactivity time");
    t.dateTime("revoked_at", { precision: 3 }).nullable().comment("when the team revoked this invitation (its link no longer opens)");
  });
  await knex.schema.alterTable("studies", (t) => {
    t.integer("inactivity_minutes").unsigned().notNullable().defaultTo(60).comment("after this long without activity a started participant releases their counterbalancing place and cap place");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => t.dropColumn("inactivity_minutes"));
  await knex.schema.alterTable("participants", (t) => {
    t.dropColumn("cb_slot");
    t.dropColumn("cb_released_at");
    t.dropColumn("cb_release_reason");
    t.dropColumn("revoked_at");
  });
}
