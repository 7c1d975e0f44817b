import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("sequence_streams", (t) => {
    t.bigIncrements("id").primary();
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.string("upload_key", 100).notNullable().comment("unique per session and sequence: makes uploads idempotent");
    t.string("condition", 200).notNullable();
    t.integer("condition_index").unsigned().notNullable();
    t.integer("block").unsigned().notNullable();
    t.integer("sequence").unsigned().notNullable();
    t.boolean("practice").notNullable().defaultTo(false);
    t.integer("sample_count").unsigned().notNullable();
    t.integer("movement_count").unsigned().notNullable();
    t.specificType("stream_gz", "LONGBLOB").nullable().comment("gzip of the raw sample stream in the replay CSV format");
    t.json("quality").nullable().comment("per-sequence data-quality figures: sample rate, gaps, dropped samples");
    t.dateTime("received_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["participant_id", "upload_key"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("sequence_streams");
}
