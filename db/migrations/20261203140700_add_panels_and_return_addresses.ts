import type { Knex } from "knex";

/** Recruitment panels: a panel's participant id arrives as a query parameter; return addresses send people back. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => {
    t.string("panel_param", 32).nullable().comment("name of the public link's query parameter that carries a recruitment panel's participant id");
    t.string("return_url_complete", 500).nullable().comment("where a participant goes after finishing; {code} takes the completion code");
    t.string("return_url_screened", 500).nullable().comment("where a participant goes when screened out (device check, study full)");
  });
  await knex.schema.alterTable("participants", (t) => {
    t.text("panel_id_encrypted").nullable().comment("the recruitment panel's participant id, AES-256-GCM (PARTICIPANT_DATA_KEY); for matching payments, never exported");
    t.string("panel_id_hmac", 64).nullable().comment("HMAC-SHA-256 of the panel id under the data key: finds a repeat visit without decrypting");
    t.unique(["study_id", "panel_id_hmac"]);
  });
  await knex.schema.alterTable("participant_contacts", (t) => {
    t.text("token_encrypted").nullable().comment("the invitation's session token, AES-256-GCM (PARTICIPANT_DATA_KEY), so a reminder carries the same link");
    t.integer("sent_count").unsigned().notNullable().defaultTo(1).comment("invitation e-mails sent, reminders included");
    t.dateTime("last_sent_at", { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participant_contacts", (t) => {
    t.dropColumn("token_encrypted");
    t.dropColumn("sent_count");
    t.dropColumn("last_sent_at");
  });
  await knex.schema.alterTable("participants", (t) => {
    t.dropUnique(["study_id", "panel_id_hmac"]);
    t.dropColumn("panel_id_encrypted");
    t.dropColumn("panel_id_hmac");
  });
  await knex.schema.alterTable("studies", (t) => {
    t.dropColumn("panel_param");
    t.dropColumn("return_url_complete");
    t.dropColumn("return_url_screened");
  });
}
