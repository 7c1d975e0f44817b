import type { Knex } from "knex";

/** Backfill: those who consented before slots existed took place i in the order they consented (cb_row = i mod rows). */
export async function up(knex: Knex): Promise<void> {
  const rows = await knex("participants").whereNotNull("cb_row").orderBy(["study_id", "consented_at", "id"]).select<{ id: number; study_id: number }[]>("id", "study_id");
  let study = -1, i = 0;
  for (const r of rows) {
    i = r.study_id === study ? i + 1 : 0;
    study = r.study_id;
    await knex("participants").where({ id: r.id }).update({ cb_slot: i });
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex("participants").update({ cb_slot: null });
}
