import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("exports", (t) => {
    t.increments("id").primary();
    t.integer("study_id").unsigned().notNullable().references("id").inTable("studies").onDelete("CASCADE");
    t.enum("status", ["queued", "running", "done", "failed"]).notNullable().defaultTo("queued");
    t.double("progress").notNullable().defaultTo(0).comment("fraction done, 0..1");
    t.string("stage", 60).notNullable().defaultTo("").comment("what the job is writing now, in words");
    t.json("options").notNullable().comment("the researcher's anonymisation choices (lib/export/options.ts)");
    t.string("path", 400).nullable().comment("the archive file, relative to EXPORTS_DIR");
    t.string("sha256", 64).nullable().comment("SHA-256 of the finished archive file");
    t.bigInteger("size_bytes").unsigned().nullable();
    t.integer("k_anonymity").unsigned().nullable().comment("smallest group of participants sharing the quasi-identifiers in participants.csv");
    t.json("warnings").nullable();
    t.text("error").nullable();
    t.integer("created_by").unsigned().notNullable().references("id").inTable("users");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("started_at", { precision: 3 }).nullable();
    t.dateTime("finished_at", { precision: 3 }).nullable();
    t.index(["study_id", "created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("exports");
}
