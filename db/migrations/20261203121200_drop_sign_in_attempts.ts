import type { Knex } from "knex";

/** Sign-in attempts are counted in rate_limits now (atomic, no addresses or e-mails kept); the old log goes. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("sign_in_attempts");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.createTable("sign_in_attempts", (t) => {
    t.bigIncrements("id").primary();
    t.string("email", 254).notNullable();
    t.string("ip", 64).notNullable();
    t.boolean("succeeded").notNullable();
    t.dateTime("at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["email", "ip", "at"]);
  });
}
