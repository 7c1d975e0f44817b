import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("outgoing_mail", (t) => {
    t.increments("id").primary();
    t.string("to_address", 254).notNullable();
    t.string("subject", 250).notNullable();
    t.string("template", 64).notNullable().comment("which message this is: reset, invite, ...");
    t.enum("status", ["queued", "sent", "failed"]).notNullable().defaultTo("queued");
    t.string("message_id", 250).nullable();
    t.string("error", 500).nullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("sent_at", { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("outgoing_mail");
}
