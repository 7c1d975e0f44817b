import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("study_pseudonym_keys", (t) => {
    t.integer("study_id").unsigned().primary().references("id").inTable("studies").onDelete("CASCADE");
    t.string("secret_hex", 64).notNullable().comment("256-bit HMAC key for stable pseudonyms; never leaves the server");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("study_pseudonym_keys");
}
