import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("consent_versions", (t) => {
    t.increments("id").primary();
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.integer("version").unsigned().notNullable();
    t.text("body_md", "longtext").notNullable().comment("the consent document, Markdown");
    t.string("sha256", 64).nullable().comment("SHA-256 of body_md's exact UTF-8 text; set when frozen (submitted)");
    t.enum("status", ["draft", "submitted", "approved", "returned"]).notNullable().defaultTo("draft");
    t.integer("created_by").unsigned().notNullable().references("id").inTable("users");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("submitted_at", { precision: 3 }).nullable();
    t.integer("decided_by").unsigned().nullable().references("id").inTable("users");
    t.dateTime("decided_at", { precision: 3 }).nullable();
    t.text("decision_comment").nullable();
    t.unique(["study_id", "version"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("consent_versions");
}
