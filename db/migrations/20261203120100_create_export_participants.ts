import type { Knex } from "knex";

/**
 * Which participants each finished archive holds, so erasing a participant supersedes exactly
 * the archives that contained them; and the archive's fate: superseded (its file deleted,
 * downloads refused) or deleted after the retention period.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("export_participants", (t) => {
    t.integer("export_id").unsigned().notNullable().references("id").inTable("exports").onDelete("CASCADE");
    t.integer("participant_id").unsigned().notNullable().references("id").inTable("participants").onDelete("CASCADE");
    t.primary(["export_id", "participant_id"]);
    t.index(["participant_id"]);
  });
  await knex.schema.alterTable("exports", (t) => {
    t.dateTime("superseded_at", { precision: 3 }).nullable().comment("set when a participant in the archive was erased: downloads are refused from then on");
    t.string("superseded_reason", 200).nullable();
    t.dateTime("file_deleted_at", { precision: 3 }).nullable().comment("when the archive file was deleted (superseded, or past the retention period)");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("exports", (t) => {
    t.dropColumn("file_deleted_at");
    t.dropColumn("superseded_reason");
    t.dropColumn("superseded_at");
  });
  await knex.schema.dropTable("export_participants");
}
