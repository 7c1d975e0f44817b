import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("study_documents", (t) => {
    t.increments("id").primary();
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.enum("kind", ["approval_letter", "protocol", "other"]).notNullable().comment("what the document is, as the uploader said");
    t.string("filename", 255).notNullable().comment("the uploader's file name, for display and download");
    t.string("mime_type", 64).notNullable().comment("from the file's magic bytes, never from the browser");
    t.integer("size_bytes").unsigned().notNullable();
    t.string("sha256", 64).notNullable().comment("SHA-256 of the exact bytes stored");
    t.string("storage_key", 200).notNullable().comment("key in the storage layer (local directory or S3 bucket)");
    t.integer("uploaded_by").unsigned().notNullable().references("id").inTable("users");
    t.dateTime("uploaded_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["study_id", "id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("study_documents");
}
