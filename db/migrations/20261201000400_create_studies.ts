import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("studies", (t) => {
    t.increments("id").primary();
    t.string("title", 200).notNullable();
    t.text("summary").notNullable();
    t.string("protocol_number", 64).nullable().comment("the ethics board's protocol number");
    t.enum("status", ["draft", "in_review", "approved", "recruiting", "closed"]).notNullable().defaultTo("draft");
    t.integer("owner_id").unsigned().notNullable().references("id").inTable("users");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("studies");
}
