import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { Knex } from "knex";

/**
 * Data only: the stick mode "snap-turn" is now "heading" (the heading stick), and its two fields
 * are renamed: snapTurnThreshold → headingRimThreshold, snapTurnDurationMs → headingTurnTimeMs.
 * Rewrites every stored study design (its base configuration and every level's configuration).
 *
 * The rename changes no behaviour, so the design's fingerprint is recomputed (SHA-256 of the
 * canonical JSON, as lib/study/designHash.ts does) and every review of the study that carried the
 * old fingerprint is moved to the new one: an approval of the old wording stands for the new, and
 * recruiting studies keep recruiting. `down` does the reverse. The rewrite lives here, not in
 * lib/, so that this migration never changes once shipped.
 */

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Direction = "up" | "down";

const FIELDS: [old: string, now: string][] = [
  ["snapTurnThreshold", "headingRimThreshold"],
  ["snapTurnDurationMs", "headingTurnTimeMs"],
];
const MODES: [old: string, now: string] = ["snap-turn", "heading"];

const isObject = (v: unknown): v is { [key: string]: Json } => v !== null && typeof v === "object" && !Array.isArray(v);

/** One configuration object renamed (keys keep their order); the same object when nothing changes. */
export function renameConfig(config: Json, direction: Direction): Json {
  if (!isObject(config)) return config;
  const from = direction === "up" ? 0 : 1, to = 1 - from;
  let changed = false;
  const out: { [key: string]: Json } = {};
  for (const [key, value] of Object.entries(config)) {
    const pair = FIELDS.find((f) => f[from] === key);
    const name = pair ? (pair[to] as string) : key;
    const v = key === "stickMode" && value === MODES[from] ? (MODES[to] as string) : value;
    if (name !== key || v !== value) changed = true;
    out[name] = v;
  }
  return changed ? out : config;
}

/** A study design with its base and level configurations renamed; null when nothing changes. */
export function renameDesign(design: Json, direction: Direction): Json | null {
  if (!isObject(design)) return null;
  let changed = false;
  const next: { [key: string]: Json } = { ...design };
  const base = renameConfig(design.baseConfig ?? null, direction);
  if (base !== (design.baseConfig ?? null)) {
    next.baseConfig = base;
    changed = true;
  }
  if (Array.isArray(design.factors)) {
    next.factors = design.factors.map((factor) => {
      if (!isObject(factor) || !Array.isArray(factor.levels)) return factor;
      return {
        ...factor,
        levels: factor.levels.map((level) => {
          if (!isObject(level)) return level;
          const config = renameConfig(level.config ?? null, direction);
          if (config === (level.config ?? null)) return level;
          changed = true;
          return { ...level, config };
        }),
      };
    });
  }
  return changed ? next : null;
}

function fingerprint(design: Json): string {
  const text = canonicalize(design);
  if (text === undefined) throw new Error("rename_heading_stick: a design that cannot be serialised");
  return createHash("sha256").update(text, "utf8").digest("hex");
}

async function rewrite(knex: Knex, direction: Direction): Promise<void> {
  await knex.transaction(async (trx) => {
    const rows = await trx("studies").whereNotNull("design").forUpdate().select<{ id: number; design: unknown; design_hash: string | null }[]>("id", "design", "design_hash");
    for (const row of rows) {
      const design = (typeof row.design === "string" ? JSON.parse(row.design) : row.design) as Json;
      const next = renameDesign(design, direction);
      if (next === null) continue;
      const hash = fingerprint(next);
      await trx("studies").where({ id: row.id }).update({ design: JSON.stringify(next), design_hash: hash });
      if (row.design_hash !== null) {
        await trx("study_reviews").where({ study_id: row.id, design_hash: row.design_hash }).update({ design_hash: hash });
      }
    }
  });
}

export async function up(knex: Knex): Promise<void> {
  await rewrite(knex, "up");
}

export async function down(knex: Knex): Promise<void> {
  await rewrite(knex, "down");
}
