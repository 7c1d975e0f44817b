import type { Knex } from "knex";

/** The plaintext typed-name column goes (its contents moved to typed_name_encrypted). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("consent_records", (t) => {
    t.dropColumn("typed_name");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("consent_records", (t) => {
    t.string("typed_name", 120).nullable().comment("identifying: only in the consent register, never in open data");
  });
}
