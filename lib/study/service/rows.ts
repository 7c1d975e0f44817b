/** Row shapes of the tables the study designer owns (mapped to domain types in this folder). */
export type StudyDesignRow = {
  id: number;
  status: "draft" | "in_review" | "approved" | "recruiting" | "closed";
  design: unknown;
  design_hash: string | null;
  participant_cap: number | null;
  public_token_hash: string | null;
  public_token_encrypted: string | null;
};

export type ConsentVersionRow = {
  id: number;
  study_id: number;
  version: number;
  body_md: string;
  sha256: string | null;
  status: "draft" | "submitted" | "approved" | "returned";
  created_by: number;
  created_at: Date;
  submitted_at: Date | null;
  decided_by: number | null;
  decided_at: Date | null;
  decision_comment: string | null;
};

export type StudyReviewRow = {
  id: number;
  study_id: number;
  /** protocol version number (null only for rows from before versions, until backfilled) */
  version: number | null;
  consent_version_id: number;
  design_hash: string;
  status: "submitted" | "approved" | "returned";
  submitted_by: number;
  submitted_at: Date;
  decided_by: number | null;
  decided_at: Date | null;
  comment: string | null;
};

export type StudyDocumentRow = {
  id: number;
  study_id: number;
  kind: "approval_letter" | "protocol" | "other";
  filename: string;
  mime_type: string;
  size_bytes: number;
  sha256: string;
  storage_key: string;
  uploaded_by: number;
  uploaded_at: Date;
};

export type ParticipantListRow = {
  id: number;
  code: string;
  source: "link" | "email" | "public";
  status: "invited" | "consented" | "in_progress" | "completed" | "withdrawn";
  created_at: Date;
  consented_at: Date | null;
  completed_at: Date | null;
  withdrawn_at: Date | null;
};
