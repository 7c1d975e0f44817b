import type { Knex } from "knex";
import { parseEnv } from "../../lib/env";
import { dataKeyFrom, openText, sealText } from "../../lib/recruitment/sealText";

/**
 * Backfill: every typed name moves into typed_name_encrypted (AES-256-GCM under
 * PARTICIPANT_DATA_KEY, the format lib/recruitment/sealText.ts defines) and leaves the plaintext
 * column; `down` moves them back.
 */
export async function up(knex: Knex): Promise<void> {
  const key = dataKeyFrom(parseEnv(process.env).PARTICIPANT_DATA_KEY);
  const rows = await knex("consent_records").whereNotNull("typed_name").select<{ id: number; typed_name: string }[]>("id", "typed_name");
  for (const r of rows) await knex("consent_records").where({ id: r.id }).update({ typed_name_encrypted: sealText(r.typed_name, key), typed_name: null });
}

export async function down(knex: Knex): Promise<void> {
  const key = dataKeyFrom(parseEnv(process.env).PARTICIPANT_DATA_KEY);
  const rows = await knex("consent_records").whereNotNull("typed_name_encrypted").select<{ id: number; typed_name_encrypted: string }[]>("id", "typed_name_encrypted");
  for (const r of rows) await knex("consent_records").where({ id: r.id }).update({ typed_name: openText(r.typed_name_encrypted, key).slice(0, 120), typed_name_encrypted: null });
}
