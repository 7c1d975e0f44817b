import { z } from "zod";

/** Editing a study's title, summary and protocol number (form and server). */
export const updateStudySchema = z.strictObject({
  title: z.string().trim().min(3, "Give the study a title of at least 3 characters.").max(200),
  summary: z.string().trim().max(5000).default(""),
  protocolNumber: z.string().trim().max(64).transform((s) => (s === "" ? null : s)).nullable().default(null),
});
export type UpdateStudyInput = z.input<typeof updateStudySchema>;

export const teamMemberSchema = z.strictObject({
  email: z.email("Enter the e-mail address of a researcher with an account.").max(254),
  role: z.enum(["editor", "viewer"]),
});
export type TeamMemberInput = z.infer<typeof teamMemberSchema>;

export const decisionSchema = z
  .strictObject({ decision: z.enum(["approve", "return"]), comment: z.string().trim().max(5000).default("") })
  .refine((d) => d.decision === "approve" || d.comment.length >= 3, { path: ["comment"], message: "Say what needs to change when returning a protocol." });
export type DecisionInput = z.input<typeof decisionSchema>;

const returnUrl = z
  .string()
  .trim()
  .max(500)
  .refine((u) => u === "" || (/^https?:\/\//i.test(u) && URL.canParse(u.replaceAll("{code}", "x").replaceAll("{panel_id}", "x"))), "Give an address starting with https:// (use {code} for the completion code, {panel_id} for the panel's participant id).")
  .transform((u) => (u === "" ? null : u))
  .nullable();

export const recruitmentSchema = z.strictObject({
  action: z.enum(["open", "close", "settings"]),
  participantCap: z.number().int().min(1).max(100_000).nullable().optional(),
  publicLink: z.boolean().optional(),
  /** After this many minutes without activity a started participant releases their place. */
  inactivityMinutes: z.number().int().min(5, "At least 5 minutes.").max(7 * 24 * 60, "At most a week.").optional(),
  /** The public link's query parameter that carries a recruitment panel's participant id (null: none). */
  panelParam: z.string().trim().regex(/^[A-Za-z][A-Za-z0-9_]{0,31}$/, "Letters, digits and _ (as the panel names it).").nullable().optional(),
  returnUrlComplete: returnUrl.optional(),
  returnUrlScreened: returnUrl.optional(),
});
export type RecruitmentInput = z.infer<typeof recruitmentSchema>;

export const invitationSchema = z.discriminatedUnion("mode", [
  z.strictObject({ mode: z.literal("links"), count: z.number().int().min(1, "Make at least 1 link.").max(1000, "At most 1000 links at a time.") }),
  z.strictObject({ mode: z.literal("email"), emails: z.array(z.email("Not an e-mail address.").max(254)).min(1, "Enter at least one address.").max(200) }),
]);
export type InvitationInput = z.infer<typeof invitationSchema>;

/** What the team may do with one invitation. */
export const invitationActionSchema = z.strictObject({ action: z.enum(["resend", "remind", "revoke"]) });

/** The invitation e-mail's own words (the link, the code and the duration are added by the product). */
export const invitationTextSchema = z.strictObject({
  text: z.string().trim().min(20, "Write a few sentences: what the study is, who runs it, that taking part is voluntary.").max(5000),
});
export type InvitationTextInput = z.infer<typeof invitationTextSchema>;
