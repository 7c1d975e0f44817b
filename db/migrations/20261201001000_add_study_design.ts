import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => {
    t.json("design").nullable().comment("the study design (lib/study/design.ts studyDesignSchema)");
    t.string("design_hash", 64).nullable().comment("SHA-256 of the design's canonical JSON, as last saved");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => {
    t.dropColumn("design");
    t.dropColumn("design_hash");
  });
}
