import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("password_tokens", (t) => {
    t.increments("id").primary();
    t.integer("user_id").unsigned().notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.string("token_hash", 64).notNullable().unique().comment("SHA-256 of the token; the token itself is only in the e-mail");
    t.enum("purpose", ["reset", "invite"]).notNullable();
    t.dateTime("expires_at", { precision: 3 }).notNullable();
    t.dateTime("used_at", { precision: 3 }).nullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("password_tokens");
}
