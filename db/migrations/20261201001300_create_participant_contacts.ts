import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("participant_contacts", (t) => {
    t.integer("participant_id").unsigned().primary().references("id").inTable("participants").onDelete("CASCADE");
    t.text("email_encrypted").notNullable().comment("AES-256-GCM, base64 iv.tag.ciphertext; key from PARTICIPANT_DATA_KEY");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("participant_contacts");
}
