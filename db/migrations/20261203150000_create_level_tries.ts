import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("level_tries", (t) => {
    t.increments("id").primary();
    t.string("token_hash", 64).notNullable().unique().comment("SHA-256 of the try token; the token is only in the /try/<token> address (and its short link)");
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.integer("created_by").unsigned().nullable().references("id").inTable("users").onDelete("SET NULL");
    t.string("label", 200).notNullable().comment("the condition or level being tried, as the designer named it");
    t.json("setup").notNullable().comment("the full transfer configuration and the task fields the runner needs; nothing a participant did is ever stored here");
    t.dateTime("expires_at", { precision: 3 }).notNullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["expires_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("level_tries");
}
