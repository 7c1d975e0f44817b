import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("study_members", (t) => {
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.integer("user_id").unsigned().notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.enum("role", ["owner", "editor", "viewer"]).notNullable().comment("the member's role within this study's team");
    t.dateTime("added_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.primary(["study_id", "user_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("study_members");
}
