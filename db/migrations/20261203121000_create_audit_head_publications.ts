import type { Knex } from "knex";

/**
 * The audit chain's head as published each day (lib/data/auditHeads.ts): mailed to the ethics
 * reviewers, who keep it outside the system; verification then shows a rewrite or a removed tail
 * even by someone who also moved the head row.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("audit_head_publications", (t) => {
    t.date("day").primary().comment("UTC day of the publication: one a day");
    t.bigInteger("last_id").unsigned().notNullable().comment("the newest entry's id then");
    t.string("hash", 64).notNullable().comment("the newest entry's hash then");
    t.bigInteger("entries").unsigned().notNullable();
    t.dateTime("published_at", { precision: 3 }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("audit_head_publications");
}
