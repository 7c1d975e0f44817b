import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participants", (t) => {
    t.integer("protocol_version_id").unsigned().nullable().references("id").inTable("study_reviews").onDelete("SET NULL")
      .comment("the approved protocol version (study_reviews row) the participant consented under and keeps");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("participants", (t) => {
    t.dropForeign(["protocol_version_id"]);
    t.dropColumn("protocol_version_id");
  });
}
