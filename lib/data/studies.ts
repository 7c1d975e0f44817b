import type { Queryable } from "@/lib/db";
import type { StudyMemberRow, StudyRow } from "./rows";

export type StudyStatus = StudyRow["status"];
export type TeamRole = StudyMemberRow["role"];
export type Study = {
  id: number;
  title: string;
  summary: string;
  protocolNumber: string | null;
  status: StudyStatus;
  ownerId: number;
  createdAt: Date;
  updatedAt: Date;
};
export type StudyListItem = Study & { ownerName: string; myRole: TeamRole | null };

export function toStudy(row: StudyRow): Study {
  return {
    id: row.id,
    title: row.title,
    summary: row.summary,
    protocolNumber: row.protocol_number,
    status: row.status,
    ownerId: row.owner_id,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}

export async function fetchStudy(q: Queryable, id: number): Promise<Study | undefined> {
  const row = await q<StudyRow>("studies").where({ id }).first();
  return row ? toStudy(row) : undefined;
}

/** The user's role in the study's team, or null when they are not on it. */
export async function fetchTeamRole(q: Queryable, studyId: number, userId: number): Promise<TeamRole | null> {
  const row = await q<StudyMemberRow>("study_members").where({ study_id: studyId, user_id: userId }).first();
  return row?.role ?? null;
}

/** Studies on which the user is a team member. */
export async function fetchStudiesForMember(q: Queryable, userId: number): Promise<StudyListItem[]> {
  const rows = await q("studies as s")
    .join("study_members as m", "m.study_id", "s.id")
    .join("users as u", "u.id", "s.owner_id")
    .where("m.user_id", userId)
    .orderBy("s.updated_at", "desc")
    .select<(StudyRow & { owner_name: string; my_role: TeamRole })[]>("s.*", "u.name as owner_name", "m.role as my_role");
  return rows.map((r) => ({ ...toStudy(r), ownerName: r.owner_name, myRole: r.my_role }));
}

/** Studies waiting for an ethics decision (the reviewers' queue): first submissions and amendments, oldest submission first. */
export async function fetchStudiesInReview(q: Queryable): Promise<(StudyListItem & { submittedAt: Date | null; protocolVersion: number | null; amendment: boolean })[]> {
  const rows = await q("studies as s")
    .join("users as u", "u.id", "s.owner_id")
    .leftJoin("study_reviews as r", function () {
      this.on("r.study_id", "=", "s.id").andOnVal("r.status", "=", "submitted");
    })
    .where((w) => w.where("s.status", "in_review").orWhereNotNull("r.id"))
    .orderByRaw("COALESCE(r.submitted_at, s.updated_at) ASC")
    .select<(StudyRow & { owner_name: string; submitted_at_r: Date | null; version_r: number | null })[]>("s.*", "u.name as owner_name", "r.submitted_at as submitted_at_r", "r.version as version_r");
  return rows.map((r) => ({ ...toStudy(r), ownerName: r.owner_name, myRole: null, submittedAt: r.submitted_at_r, protocolVersion: r.version_r, amendment: r.status !== "in_review" }));
}

export async function insertStudy(
  q: Queryable,
  study: { title: string; summary: string; protocolNumber: string | null; ownerId: number },
): Promise<number> {
  const [id] = await q("studies").insert({
    title: study.title,
    summary: study.summary,
    protocol_number: study.protocolNumber,
    owner_id: study.ownerId,
  });
  const studyId = Number(id);
  await q("study_members").insert({ study_id: studyId, user_id: study.ownerId, role: "owner" });
  return studyId;
}

export async function addTeamMember(q: Queryable, studyId: number, userId: number, role: TeamRole): Promise<void> {
  await q("study_members").insert({ study_id: studyId, user_id: userId, role }).onConflict(["study_id", "user_id"]).merge({ role });
}

/** A study a reviewer approved, with where it stands now. */
export type ApprovedStudy = StudyListItem & { versionsApproved: number[]; lastApprovedAt: Date; inForceVersion: number | null; amendmentWaiting: boolean; completed: number };

/**
 * The studies a reviewer approved (fetchStudiesApprovedBy), most recent approval first: which
 * protocol versions they approved, the version in force now, whether an amendment waits, and how
 * many real participants have completed — what a reviewer needs to follow up on a decision.
 */
export async function fetchStudiesApprovedBy(q: Queryable, reviewerId: number): Promise<ApprovedStudy[]> {
  const decisions = await q("study_reviews").where({ decided_by: reviewerId, status: "approved" }).orderBy("decided_at", "desc")
    .select<{ study_id: number; version: number | null; decided_at: Date }[]>("study_id", "version", "decided_at");
  if (decisions.length === 0) return [];
  const ids = [...new Set(decisions.map((d) => d.study_id))];
  const [rows, inForce, waiting, completed] = await Promise.all([
    q("studies as s").join("users as u", "u.id", "s.owner_id").whereIn("s.id", ids).select<(StudyRow & { owner_name: string })[]>("s.*", "u.name as owner_name"),
    q("study_reviews").whereIn("study_id", ids).where({ status: "approved" }).groupBy("study_id").select<{ study_id: number; v: number | null }[]>("study_id", q.raw("MAX(version) as v")),
    q("study_reviews").whereIn("study_id", ids).where({ status: "submitted" }).select<{ study_id: number }[]>("study_id"),
    q("participants").whereIn("study_id", ids).where({ kind: "real", status: "completed" }).groupBy("study_id").select<{ study_id: number; n: number }[]>("study_id", q.raw("COUNT(*) as n")),
  ]);
  return ids.flatMap((id) => {
    const r = rows.find((x) => x.id === id);
    if (!r) return [];
    const mine = decisions.filter((d) => d.study_id === id);
    return [{
      ...toStudy(r), ownerName: r.owner_name, myRole: null,
      versionsApproved: mine.map((d) => d.version ?? 0).sort((a, b) => a - b), lastApprovedAt: mine[0]!.decided_at,
      inForceVersion: inForce.find((x) => x.study_id === id)?.v ?? null, amendmentWaiting: waiting.some((x) => x.study_id === id),
      completed: Number(completed.find((x) => x.study_id === id)?.n ?? 0),
    }];
  });
}
