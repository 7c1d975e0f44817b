import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("questionnaire_answers", (t) => {
    t.bigIncrements("id").primary();
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.string("condition", 200).notNullable().defaultTo("").comment("condition label; empty for the final questionnaire");
    t.string("item_id", 32).notNullable();
    t.integer("value_int").nullable();
    t.string("value_text", 2000).nullable().comment("free text or a category; free text leaves in open data only when chosen");
    t.dateTime("answered_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["participant_id", "condition", "item_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("questionnaire_answers");
}
