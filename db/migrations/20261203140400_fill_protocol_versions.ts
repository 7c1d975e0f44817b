import type { Knex } from "knex";

/**
 * Backfill: number the reviews of each study in submission order, and give the ones made before
 * protocol versions existed the study's current title, summary and design (the best record there is).
 */
export async function up(knex: Knex): Promise<void> {
  const reviews = await knex("study_reviews").orderBy(["study_id", "id"]).select<{ id: number; study_id: number }[]>("id", "study_id");
  let study = -1, n = 0;
  for (const r of reviews) {
    n = r.study_id === study ? n + 1 : 1;
    study = r.study_id;
    await knex("study_reviews").where({ id: r.id }).update({ version: n });
  }
  await knex.raw(
    "UPDATE study_reviews r JOIN studies s ON s.id = r.study_id SET r.title = s.title, r.summary = s.summary, r.design = s.design WHERE r.design IS NULL",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex("study_reviews").update({ version: null, title: null, summary: null, design: null });
}
