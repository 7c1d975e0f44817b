import type { Knex } from "knex";

/** A session version per account: a password change, a deactivation or a role change raises it, which ends the account's existing sessions. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("users", (t) => {
    t.integer("session_version").unsigned().notNullable().defaultTo(0).comment("carried in each session's JWT; a session with an older value is refused");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("users", (t) => {
    t.dropColumn("session_version");
  });
}
