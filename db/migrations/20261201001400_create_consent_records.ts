import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("consent_records", (t) => {
    t.increments("id").primary();
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.integer("consent_version_id").unsigned().notNullable().references("id").inTable("consent_versions");
    t.string("version_hash", 64).notNullable().comment("SHA-256 of the consent text the participant saw");
    t.json("agreed").notNullable().comment("ids of the statements the participant ticked");
    t.string("typed_name", 120).nullable().comment("identifying: only in the consent register, never in open data");
    t.dateTime("signed_at", { precision: 3 }).notNullable().comment("server time");
    t.json("device_summary").notNullable().comment("coarse: device class, browser family, screen size band");
    t.dateTime("withdrawn_at", { precision: 3 }).nullable();
    t.unique(["participant_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("consent_records");
}
