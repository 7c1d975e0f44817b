import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("calibrations", (t) => {
    t.increments("id").primary();
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.enum("kind", ["device_check", "bias", "card", "blind_spot"]).notNullable();
    t.json("result").notNullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["participant_id", "kind"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("calibrations");
}
