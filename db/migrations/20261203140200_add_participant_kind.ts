import type { Knex } from "knex";

/** Pilot and simulated participants live beside real ones, kept apart by `kind`. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participants", (t) => {
    t.enum("kind", ["real", "pilot", "simulated"]).notNullable().defaultTo("real").comment("real: recruited; pilot: a team member trying the session; simulated: the simulated participant");
    t.boolean("included").notNullable().defaultTo(false).comment("pilot or simulated participant that the team includes in results and archives (real ones always are)");
    t.json("pilot_design").nullable().comment("the design a pilot or simulated participant ran: the study's working copy when it began");
    t.index(["study_id", "kind"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participants", (t) => {
    t.dropIndex(["study_id", "kind"]);
    t.dropColumn("kind");
    t.dropColumn("included");
    t.dropColumn("pilot_design");
  });
}
