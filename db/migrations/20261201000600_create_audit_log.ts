import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("audit_log", (t) => {
    t.bigIncrements("id").primary();
    t.dateTime("at", { precision: 3 }).notNullable();
    t.integer("actor_user_id").unsigned().nullable().comment("null for participants and the system");
    t.string("actor_label", 120).notNullable().comment("who acted, as shown to auditors (user e-mail, 'participant', 'system')");
    t.string("action", 64).notNullable();
    t.integer("study_id").unsigned().nullable();
    t.json("details").notNullable();
    t.string("prev_hash", 64).notNullable().comment("hash of the previous entry; 64 zeros for the first");
    t.string("hash", 64).notNullable().comment("SHA-256 over prev_hash and the entry's canonical JSON");
    t.index(["study_id", "id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("audit_log");
}
