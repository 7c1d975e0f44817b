import { createHash, createHmac } from "node:crypto";
import canonicalize from "canonicalize";
import type { Knex } from "knex";
import { parseEnv } from "../../lib/env";

/**
 * The audit chain becomes keyed: each entry's hash is HMAC-SHA-256 under AUDIT_KEY (kept outside
 * the database) instead of a plain SHA-256 anyone with database access could recompute. The
 * existing chain is sealed once under the key, in id order; `down` recomputes plain SHA-256.
 * A frozen copy of the canonical form (RFC 8785) of lib/data/audit.ts, so this migration never
 * changes with the module.
 */
type Row = { id: number; at: Date; actor_user_id: number | null; actor_label: string; action: string; study_id: number | null; details: unknown };

function canonical(r: Row): string {
  const details = typeof r.details === "string" ? (JSON.parse(r.details) as unknown) : r.details;
  const text = canonicalize({ at: r.at.toISOString(), actorUserId: r.actor_user_id, actorLabel: r.actor_label, action: r.action, studyId: r.study_id, details });
  if (text === undefined) throw new Error(`audit entry ${r.id} is not serialisable`);
  return text;
}

async function rechain(knex: Knex, mac: (data: string) => string): Promise<void> {
  let prev = "0".repeat(64), last = 0, entries = 0;
  for (;;) {
    const rows = await knex<Row>("audit_log").where("id", ">", last).orderBy("id").limit(1000);
    for (const r of rows) {
      const hash = mac(prev + canonical(r));
      await knex("audit_log").where({ id: r.id }).update({ prev_hash: prev, hash });
      prev = hash;
      last = r.id;
      entries++;
    }
    if (rows.length < 1000) break;
  }
  await knex("audit_head").where({ id: 1 }).update({ last_id: last, hash: prev, entries });
}

export async function up(knex: Knex): Promise<void> {
  const key = parseEnv(process.env).AUDIT_KEY;
  await rechain(knex, (data) => createHmac("sha256", Buffer.from(key, "utf8")).update(data, "utf8").digest("hex"));
  await knex.schema.alterTable("audit_log", (t) => {
    t.string("hash", 64).notNullable().alter().comment("HMAC-SHA-256 under AUDIT_KEY (outside the database) over prev_hash and the entry's canonical JSON");
  });
}

export async function down(knex: Knex): Promise<void> {
  await rechain(knex, (data) => createHash("sha256").update(data, "utf8").digest("hex"));
  await knex.schema.alterTable("audit_log", (t) => {
    t.string("hash", 64).notNullable().alter().comment("SHA-256 over prev_hash and the entry's canonical JSON");
  });
}
