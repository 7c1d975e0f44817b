import type { Knex } from "knex";

/** Backfill: participants who consented before versions existed ran the newest version approved before their consent. */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    UPDATE participants p SET p.protocol_version_id = (
      SELECT r.id FROM study_reviews r
       WHERE r.study_id = p.study_id AND r.status = 'approved' AND (r.decided_at IS NULL OR r.decided_at <= p.consented_at)
       ORDER BY r.id DESC LIMIT 1)
     WHERE p.consented_at IS NOT NULL`);
}

export async function down(knex: Knex): Promise<void> {
  await knex("participants").update({ protocol_version_id: null });
}
