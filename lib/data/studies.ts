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

/** Studies waiting for an ethics decision (the reviewers' queue). */
export async function fetchStudiesInReview(q: Queryable): Promise<StudyListItem[]> {
  const rows = await q("studies as s")
    .join("users as u", "u.id", "s.owner_id")
    .where("s.status", "in_review")
    .orderBy("s.updated_at", "asc")
    .select<(StudyRow & { owner_name: string })[]>("s.*", "u.name as owner_name");
  return rows.map((r) => ({ ...toStudy(r), ownerName: r.owner_name, myRole: null }));
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
