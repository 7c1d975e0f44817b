/** Row shapes as MariaDB returns them (mapped to domain types in the data modules, never shown to pages). */
export type UserRow = {
  id: number;
  email: string;
  name: string;
  password_hash: string | null;
  role: string;
  active: number | boolean;
  session_version: number;
  created_at: Date;
  updated_at: Date;
};

export type StudyRow = {
  id: number;
  title: string;
  summary: string;
  protocol_number: string | null;
  status: "draft" | "in_review" | "approved" | "recruiting" | "closed";
  owner_id: number;
  created_at: Date;
  updated_at: Date;
};

export type StudyMemberRow = { study_id: number; user_id: number; role: "owner" | "editor" | "viewer"; added_at: Date };

export type AuditRow = {
  id: number;
  at: Date;
  actor_user_id: number | null;
  actor_label: string;
  action: string;
  study_id: number | null;
  details: unknown;
  prev_hash: string;
  hash: string;
};

export type PasswordTokenRow = {
  id: number;
  user_id: number;
  token_hash: string;
  purpose: "reset" | "invite";
  expires_at: Date;
  used_at: Date | null;
  created_at: Date;
};
