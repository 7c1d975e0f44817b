import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("trials", (t) => {
    t.bigIncrements("id").primary();
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.string("condition", 200).notNullable().comment("condition label");
    t.integer("condition_index").unsigned().notNullable();
    t.integer("block").unsigned().notNullable();
    t.integer("sequence").unsigned().notNullable().comment("unique within participant x condition x block");
    t.integer("trial").unsigned().notNullable().comment("movement number within the sequence, from 1");
    t.boolean("practice").notNullable().defaultTo(false);
    t.string("unit", 12).notNullable().comment("px | mm | deg: the unit of every coordinate, amplitude and width");
    t.double("amplitude").notNullable();
    t.double("width").notNullable();
    for (const c of ["from_x", "from_y", "to_x", "to_y", "start_x", "start_y", "end_x", "end_y"]) t.double(c).notNullable();
    t.double("time_ms").notNullable().comment("movement time");
    t.boolean("hit").notNullable();
    t.string("upload_key", 100).notNullable().comment("the sequence upload this row came with");
    t.dateTime("received_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["participant_id", "practice", "block", "condition_index", "sequence", "trial"], { indexName: "trials_once" });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("trials");
}
