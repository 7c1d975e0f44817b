import type { Knex } from "knex";

/** A researcher's decision to leave a participant or one sequence out of results and archives, with the reason. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("exclusions", (t) => {
    t.increments("id").primary();
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.enum("scope", ["participant", "sequence"]).notNullable();
    t.integer("condition_index").unsigned().nullable().comment("sequence scope: the sequence's condition (index into the design's conditions)");
    t.integer("block").unsigned().nullable();
    t.integer("sequence").unsigned().nullable();
    t.string("reason", 500).notNullable().comment("the researcher's reason, reported with the results and in archives");
    t.integer("created_by").unsigned().nullable().references("id").inTable("users").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("revoked_at", { precision: 3 }).nullable().comment("when the exclusion was taken back (kept for the record)");
    t.integer("revoked_by").unsigned().nullable().references("id").inTable("users").onDelete("SET NULL");
    t.index(["study_id", "revoked_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("exclusions");
}
