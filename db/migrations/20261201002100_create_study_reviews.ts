import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("study_reviews", (t) => {
    t.increments("id").primary();
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.integer("consent_version_id").unsigned().notNullable().references("id").inTable("consent_versions");
    t.string("design_hash", 64).notNullable().comment("the design as submitted; recruitment needs the study's current design_hash to match an approved review");
    t.enum("status", ["submitted", "approved", "returned"]).notNullable().defaultTo("submitted");
    t.integer("submitted_by").unsigned().notNullable().references("id").inTable("users");
    t.dateTime("submitted_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.integer("decided_by").unsigned().nullable().references("id").inTable("users");
    t.dateTime("decided_at", { precision: 3 }).nullable();
    t.text("comment").nullable().comment("the reviewer's comment with the decision");
    t.index(["study_id", "id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("study_reviews");
}
