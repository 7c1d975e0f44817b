import type { Knex } from "knex";

/** Typed consent names are kept encrypted at rest, like contacts (the backfill is the next migration's). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("consent_records", (t) => {
    t.text("typed_name_encrypted").nullable().comment("the typed name, AES-256-GCM (base64 iv.tag.ciphertext, key from PARTICIPANT_DATA_KEY); only the consent register shows it");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("consent_records", (t) => {
    t.dropColumn("typed_name_encrypted");
  });
}
