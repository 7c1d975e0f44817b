import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => {
    t.integer("participant_cap").unsigned().nullable().comment("most participants the study takes (all sources); null: no cap");
    t.string("public_token_hash", 64).nullable().unique().comment("SHA-256 of the public link's token");
    t.text("public_token_encrypted").nullable().comment("the public link's token, AES-256-GCM (PARTICIPANT_DATA_KEY), so the team can show it again");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => {
    t.dropUnique(["public_token_hash"]);
    t.dropColumn("participant_cap");
    t.dropColumn("public_token_hash");
    t.dropColumn("public_token_encrypted");
  });
}
