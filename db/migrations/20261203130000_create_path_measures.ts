import type { Knex } from "knex";

/** Path accuracy per recorded sequence, computed once from its stream and kept until its inputs change. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("path_measures", (t) => {
    t.bigIncrements("id").primary();
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.bigInteger("stream_id").unsigned().notNullable().unique().references("id").inTable("sequence_streams").onDelete("CASCADE");
    t.string("inputs_hash", 64).notNullable().comment("SHA-256 of what the measures were computed from (configuration, calibration, method version): a change recomputes them");
    t.json("measures").nullable().comment("per movement: trial and TRE, TAC, MDC, ODC, MV, ME, MO; null when they could not be computed");
    t.double("residual").nullable().comment("largest distance between a replayed and a recorded selection point, task units");
    t.string("note", 300).nullable().comment("why the measures could not be computed");
    t.dateTime("computed_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["participant_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("path_measures");
}
