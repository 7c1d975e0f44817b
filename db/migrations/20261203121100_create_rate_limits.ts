import type { Knex } from "knex";

/**
 * Counters of the rate limits (lib/auth/rate-limit.ts): one row per bucket and fixed window,
 * incremented atomically (INSERT … ON DUPLICATE KEY UPDATE), so parallel requests cannot all pass
 * a check made before any of them is counted. Buckets are keyed hashes, never an address or e-mail.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("rate_limits", (t) => {
    t.string("bucket", 64).notNullable().comment("HMAC-SHA-256 (hex) of what is limited: an account, an address, a session link");
    t.dateTime("window_start", { precision: 3 }).notNullable();
    t.integer("hits").unsigned().notNullable().defaultTo(0);
    t.primary(["bucket", "window_start"]);
    t.index(["window_start"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("rate_limits");
}
