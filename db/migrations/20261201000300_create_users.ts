import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("users", (t) => {
    t.increments("id").primary();
    t.string("email", 254).notNullable().unique().comment("stored lower-case");
    t.string("name", 120).notNullable();
    t.string("password_hash", 100).nullable().comment("bcrypt; null until an invited user sets a password");
    t.string("role", 32).notNullable().references("name").inTable("roles").onUpdate("CASCADE");
    t.boolean("active").notNullable().defaultTo(true);
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("users");
}
