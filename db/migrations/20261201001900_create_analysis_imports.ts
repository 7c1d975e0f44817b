import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("analysis_imports", (t) => {
    t.increments("id").primary();
    t.integer("user_id").unsigned().notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.string("filename", 255).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.string("sha256", 64).notNullable().comment("SHA-256 of the uploaded file");
    t.string("storage_key", 255).notNullable().comment("where the uploaded CSV is kept, relative to STORAGE_DIR");
    t.json("options").notNullable().comment("analysis options: start, exclude, unit");
    t.json("result").notNullable().comment("the analysis JSON (docs/analysis.md)");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["user_id", "created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("analysis_imports");
}
