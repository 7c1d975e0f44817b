import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("participants", (t) => {
    t.increments("id").primary();
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.string("code", 16).notNullable().comment("pseudonymous participant code shown to researchers (P-XXXXXX)");
    t.string("token_hash", 64).notNullable().unique().comment("SHA-256 of the 128-bit session link token; the token is only in the link");
    t.enum("source", ["link", "email", "public"]).notNullable();
    t.enum("status", ["invited", "consented", "in_progress", "completed", "withdrawn"]).notNullable().defaultTo("invited");
    t.integer("cb_row").unsigned().nullable().comment("counterbalancing row (0-based) assigned at consent");
    t.json("condition_order").nullable().comment("condition labels in this participant's order");
    t.json("between_levels").nullable().comment("levels of between-subject factors {name: level}");
    t.string("completion_code", 32).nullable();
    t.json("progress").nullable().comment("the runner's resumable state: step, block, condition, sequence");
    t.json("device").nullable().comment("coarse device details: input types, sensor rate; nothing identifying");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("consented_at", { precision: 3 }).nullable();
    t.dateTime("started_at", { precision: 3 }).nullable();
    t.dateTime("completed_at", { precision: 3 }).nullable();
    t.dateTime("withdrawn_at", { precision: 3 }).nullable();
    t.dateTime("last_activity_at", { precision: 3 }).nullable();
    t.unique(["study_id", "code"]);
    t.index(["study_id", "status"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("participants");
}
