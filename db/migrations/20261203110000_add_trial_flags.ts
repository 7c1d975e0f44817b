import type { Knex } from "knex";

/** Movement flags of the trial table (interfaces.md: optional columns timed_out, recentered, clutched). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("trials", (t) => {
    t.boolean("timed_out").notNullable().defaultTo(false).comment("the trial time limit ended the movement, not a selection by the participant");
    t.boolean("recentered").notNullable().defaultTo(false).comment("the participant recentred during the movement");
    t.boolean("clutched").notNullable().defaultTo(false).comment("the clutch was engaged at some moment of the movement");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("trials", (t) => {
    t.dropColumn("timed_out");
    t.dropColumn("recentered");
    t.dropColumn("clutched");
  });
}
