import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("short_links", (t) => {
    t.increments("id").primary();
    t.string("code_hash", 64).notNullable().unique().comment("SHA-256 of the short code; the code itself is only in the link and its QR code");
    t.string("purpose", 32).notNullable().comment("what the link opens: pilot (a pilot session), try-level (a level of the design to feel)");
    t.text("target_encrypted").notNullable().comment("the path on this server the link leads to, AES-256-GCM (PARTICIPANT_DATA_KEY): it may hold a session token");
    t.integer("study_id").unsigned().nullable().references("id").inTable("studies").onDelete("CASCADE");
    t.integer("created_by").unsigned().nullable().references("id").inTable("users").onDelete("SET NULL");
    t.dateTime("expires_at", { precision: 3 }).notNullable();
    t.integer("opened").unsigned().notNullable().defaultTo(0).comment("how often the link was followed");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["expires_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("short_links");
}
