import type { Knex } from "knex";

/**
 * The audit chain's head in a row of its own (lib/data/audit.ts): an append locks it, links the
 * new entry to it and moves it, inside the transaction of the action it records, so entries
 * cannot fork and an action cannot commit without its entry. Verification also compares it with
 * the last entry, so a removed tail shows.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("audit_head", (t) => {
    t.tinyint("id").unsigned().primary().comment("always 1: one head");
    t.bigInteger("last_id").unsigned().notNullable().defaultTo(0).comment("id of the newest entry; 0 before the first");
    t.string("hash", 64).notNullable().comment("hash of the newest entry; 64 zeros before the first");
    t.bigInteger("entries").unsigned().notNullable().defaultTo(0).comment("how many entries the chain holds");
  });
  const last = await knex("audit_log").orderBy("id", "desc").first<{ id: number; hash: string } | undefined>("id", "hash");
  const count = await knex("audit_log").count<{ n: number | string }[]>({ n: "*" });
  await knex("audit_head").insert({ id: 1, last_id: last?.id ?? 0, hash: last?.hash ?? "0".repeat(64), entries: Number(count[0]?.n ?? 0) });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("audit_head");
}
