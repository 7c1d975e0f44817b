import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { db } from "@/lib/db";
import {
  assertStudyTeam, fetchCalibrations, fetchStreamBytes, fetchStreamMeta, fetchStudyDesign, fetchStudyParticipant, fetchStudyTrialRecords,
} from "@/lib/data/results";
import { notFound } from "@/lib/errors";
import { NO_CALIBRATION, participantView } from "@/lib/results";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string; pid: string }> };
const paramsSchema = z.object({ id: z.coerce.number().int().positive(), pid: z.coerce.number().int().positive() });
const querySchema = z.object({ stream: z.coerce.number().int().positive().optional() });

/** GET: one participant's sequences, quality flags and a replayed trajectory (?stream=ID). Study team only. */
export const GET = route(async (request: Request, context: Ctx) => {
  const { id, pid } = parseParams(paramsSchema, await context.params);
  await assertStudyTeam(db, await getCurrentUser(), id);
  const { stream } = querySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  const participant = await fetchStudyParticipant(db, id, pid);
  const design = await fetchStudyDesign(db, id);
  if (!participant || !design) throw notFound("No such participant in this study.");
  const metas = await fetchStreamMeta(db, pid);
  const streams = [];
  for (const m of metas) streams.push({ ...m, gz: await fetchStreamBytes(db, m.id) });
  const view = participantView(design, participant.code, await fetchStudyTrialRecords(db, id, pid), streams, (await fetchCalibrations(db, [pid])).get(pid) ?? NO_CALIBRATION, stream ?? null);
  return Response.json(
    { participant, streams: metas.map(({ quality: _q, ...m }) => m), view },
    { headers: { "cache-control": "no-store" } },
  );
});
