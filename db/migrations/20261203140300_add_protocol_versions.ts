import type { Knex } from "knex";

/**
 * A submission for review becomes a protocol version: the snapshot of everything the reviewer
 * approves (participant information, design, consent version, invitation text, erasure window).
 * The study's own columns stay the working copy the team edits; participants run the approved
 * version they consented under.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("study_reviews", (t) => {
    t.integer("version").unsigned().nullable().comment("protocol version number within the study, from 1, in submission order");
    t.string("title", 200).nullable().comment("participant information as submitted: the title");
    t.text("summary").nullable().comment("participant information as submitted: what the information page says");
    t.json("design").nullable().comment("the design as submitted (design_hash is its fingerprint)");
    t.text("invitation_text").nullable().comment("the invitation e-mail's text as submitted");
    t.integer("erasure_window_days").unsigned().nullable().comment("days after the session within which a participant may ask for erasure, as the consent text states; null: no limit");
  });
  await knex.schema.alterTable("studies", (t) => {
    t.text("invitation_text").nullable().comment("working copy of the invitation e-mail's text (part of the protocol)");
    t.integer("erasure_window_days").unsigned().nullable().comment("working copy: days after the session within which erasure may be asked (part of the protocol); null: no limit");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("studies", (t) => {
    t.dropColumn("invitation_text");
    t.dropColumn("erasure_window_days");
  });
  await knex.schema.alterTable("study_reviews", (t) => {
    for (const c of ["version", "title", "summary", "design", "invitation_text", "erasure_window_days"]) t.dropColumn(c);
  });
}
