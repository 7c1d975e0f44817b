import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { AppError } from "@/lib/errors";
import { lockActiveParticipant } from "./participantLock";
import { betweenLevelsFor, firstFreeSlot, holdsPlace, orderForParticipant, placeBalance, type PlaceCell } from "@/lib/study/counterbalance";
import { conditionsOf, type StudyDesign } from "@/lib/study/design";
import { assertConsented, jsonColumn, type ParticipantRow, type SessionContext } from "./participants";

/** The study's inactivity time, ms: after it a started participant stops holding a place. */
export async function inactivityMs(q: Queryable, studyId: number): Promise<number> {
  const row = await q("studies").where({ id: studyId }).first<{ inactivity_minutes: number } | undefined>("inactivity_minutes");
  return (row?.inactivity_minutes ?? 60) * 60_000;
}

/**
 * How many real participants count toward the cap (countTowardCap): the completed, and those
 * active within the inactivity time whose place was not released (a device-check refusal, a
 * withdrawal or inactivity releases it) and whose invitation was not revoked. E-mailed and bulk
 * invitations nobody has opened yet do not count; a public-link visitor who pressed "Start" does.
 */
export async function countTowardCap(q: Queryable, studyId: number, now: Date, exceptId?: number): Promise<number> {
  const since = new Date(now.getTime() - (await inactivityMs(q, studyId)));
  const query = q("participants")
    .where({ study_id: studyId, kind: "real" })
    .whereNull("revoked_at")
    .whereNull("cb_released_at")
    .where((w) => w.where("status", "completed").orWhere((a) => a.whereIn("status", ["invited", "consented", "in_progress"]).andWhere("last_activity_at", ">=", since)));
  if (exceptId !== undefined) query.whereNot("id", exceptId);
  const r = await query.count<{ n: number }[]>({ n: "*" });
  return Number(r[0]?.n ?? 0);
}

/** Refuses one more participant when the cap is reached (call under the study row's lock: the check and the write must not interleave). */
export async function assertCapRoom(q: Queryable, studyId: number, now: Date, exceptId?: number): Promise<void> {
  const row = await q("studies").where({ id: studyId }).first<{ participant_cap: number | null } | undefined>("participant_cap");
  const cap = row?.participant_cap ?? null;
  if (cap !== null && (await countTowardCap(q, studyId, now, exceptId)) >= cap) throw conflictFull();
}

/** The refusal when the study has all the participants it asked for (409, code "full"). */
export const conflictFull = () => new AppError(409, "full", "This study has all the participants it needs at the moment. Thank you for your interest.");

/**
 * Starts the task part of a session (startTasks), when the runner is about to show the first
 * sequence: a real participant takes the first free counterbalancing place (released places
 * first, so the completed sample stays balanced) and with it the row's condition order and the
 * between-subject group; a pilot takes an order in turn without taking a place. Idempotent: a
 * session that already has its order keeps it. Runs under the study row's lock, so two
 * participants starting at once never take the same place; inactive holders are released here.
 * @throws 409 before consent, 410 withdrawn (assertConsented).
 */
export async function startTasks(db: Knex, ctx: SessionContext, now = new Date()): Promise<{ order: string[]; row: number | null }> {
  const existing = jsonColumn(ctx.participant.condition_order);
  if (Array.isArray(existing)) return { order: existing as string[], row: ctx.participant.cb_row };
  assertConsented(ctx);
  const conditions = conditionsOf(ctx.design);
  const pilot = ctx.participant.kind !== "real";
  const result = await db.transaction(async (trx) => {
    await trx("studies").where({ id: ctx.study.id }).forUpdate().first("id");
    await lockActiveParticipant(trx, ctx.participant.id, {}, now); // the row lock, the status checked in the same statement
    const current = (await trx<ParticipantRow>("participants").where({ id: ctx.participant.id }).first())!;
    const already = jsonColumn(current.condition_order);
    if (Array.isArray(already)) return { order: already as string[], row: current.cb_row, slot: current.cb_slot, fresh: false };
    let slot: number | null = null;
    let index: number;
    if (pilot) {
      const r = await trx("participants").where({ study_id: ctx.study.id }).whereNot({ kind: "real" }).whereNotNull("condition_order").count<{ n: number }[]>({ n: "*" });
      index = Number(r[0]?.n ?? 0);
    } else {
      slot = await takeFirstFreeSlot(trx, ctx.study.id, now);
      index = slot;
    }
    const { row, order } = orderForParticipant(ctx.design, index);
    const labels = order.map((i) => conditions[i]!.label);
    await trx("participants").where({ id: ctx.participant.id }).update({
      cb_slot: slot, cb_row: pilot ? null : row, condition_order: JSON.stringify(labels), between_levels: JSON.stringify(betweenLevelsFor(ctx.design, index)),
      status: "in_progress", started_at: now, last_activity_at: now,
    });
    // row and place counted from 1, as the design and participants pages show them; the entry commits with the start
    const placed = pilot ? { pilot: true } : { row: row + 1, place: slot! + 1 };
    await appendAudit(trx, { actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.started", studyId: ctx.study.id, details: { participant: ctx.participant.code, ...placed } });
    return { order: labels, row: pilot ? null : row, slot, fresh: true };
  });
  return { order: result.order, row: result.row };
}

/** The first place no real participant holds; releases the places of those inactive for longer than the study allows. */
async function takeFirstFreeSlot(trx: Knex.Transaction, studyId: number, now: Date): Promise<number> {
  const limit = await inactivityMs(trx, studyId);
  const holders = await trx("participants").where({ study_id: studyId, kind: "real" }).whereNotNull("cb_slot").whereNull("cb_released_at")
    .select<{ id: number; cb_slot: number; status: ParticipantRow["status"]; last_activity_at: Date | null }[]>("id", "cb_slot", "status", "last_activity_at");
  const taken: number[] = [];
  const stale: number[] = [];
  for (const h of holders) {
    if (holdsPlace({ slot: h.cb_slot, status: h.status, releasedAt: null, lastActivityAt: h.last_activity_at }, now.getTime(), limit)) taken.push(h.cb_slot);
    else if (h.status === "consented" || h.status === "in_progress") stale.push(h.id);
  }
  if (stale.length > 0) await trx("participants").whereIn("id", stale).update({ cb_released_at: now, cb_release_reason: "inactive" });
  return firstFreeSlot(taken);
}

/**
 * The design page's table of counterbalancing places (fetchPlaceBalance): for each row (and
 * between-subject group), how many planned places are filled by completed participants, held by
 * participants in progress, and free. Pilots never hold a place.
 */
export async function fetchPlaceBalance(q: Queryable, studyId: number, design: StudyDesign, now = new Date()): Promise<{ cells: PlaceCell[]; released: number }> {
  const limit = await inactivityMs(q, studyId);
  const rows = await q("participants").where({ study_id: studyId, kind: "real" }).whereNotNull("cb_slot")
    .select<{ cb_slot: number; status: ParticipantRow["status"]; cb_released_at: Date | null; last_activity_at: Date | null }[]>("cb_slot", "status", "cb_released_at", "last_activity_at");
  const holders = rows
    .filter((r) => holdsPlace({ slot: r.cb_slot, status: r.status, releasedAt: r.cb_released_at, lastActivityAt: r.last_activity_at }, now.getTime(), limit))
    .map((r) => ({ slot: r.cb_slot, state: r.status === "completed" ? ("completed" as const) : ("in_progress" as const) }));
  return { cells: placeBalance(design, holders, design.plannedParticipants), released: rows.length - holders.length };
}
