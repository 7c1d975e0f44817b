import type { Knex } from "knex";

/**
 * The export queue (lib/data/exportQueue.ts): a running job's process writes heartbeat_at every
 * few seconds, so a job whose process died with its server is seen as dead and failed; the
 * queue reads jobs by status in id order.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("exports", (t) => {
    t.dateTime("heartbeat_at", { precision: 3 }).nullable().comment("last sign of life of the job's process while it runs");
    t.index(["status", "id"], "exports_status_id");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("exports", (t) => {
    t.dropIndex(["status", "id"], "exports_status_id");
    t.dropColumn("heartbeat_at");
  });
}
