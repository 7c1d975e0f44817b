import type { Queryable } from "@/lib/db";
import { fetchSessionByToken } from "@/lib/data/participants";
import { fetchInForceVersion } from "@/lib/study/service/protocol";
import { conditionConfig, conditionsOf, studyDesignSchema } from "@/lib/study/design";
import { designSummary } from "@/lib/study/summary/designSummary";
import { studyOfPublicLink } from "./service";

/** The cookie that remembers a public-link visitor's own session in this browser (one per study). */
export const visitorCookieName = (studyId: number) => `yp_visit_${studyId}`;

/** Panel ids are short printable identifiers; anything else is ignored. */
export const PANEL_ID_PATTERN = /^[\x21-\x7e]{1,128}$/;

/** What the public link's information page shows: the version in force, in words participants read. */
export type PublicStudyInfo = {
  studyId: number;
  recruiting: boolean;
  title: string;
  summary: string;
  minutes: number | null;
  compensation: string;
  viewMode: boolean;
  /** Some condition is aimed by turning the device (motion sensors): the wrist caution applies. */
  turnsDevice: boolean;
  panelParam: string | null;
};

/** The information page's content for a public link token, or undefined for an unknown link. Creates nothing. */
export async function publicStudyInfo(q: Queryable, publicToken: string): Promise<PublicStudyInfo | undefined> {
  const study = await studyOfPublicLink(q, publicToken);
  if (!study) return undefined;
  const inForce = await fetchInForceVersion(q, study.id);
  const parsed = inForce ? studyDesignSchema.safeParse(inForce.design) : null;
  const design = parsed?.success ? parsed.data : null;
  const own = await q("studies").where({ id: study.id }).first<{ title: string; summary: string }>("title", "summary");
  return {
    studyId: study.id, recruiting: study.status === "recruiting",
    title: inForce?.title || own!.title, summary: inForce ? inForce.summary : own!.summary,
    minutes: design ? designSummary(design).estimatedMinutes : null, compensation: design?.compensation ?? "", viewMode: design?.task.displayMode === "view",
    turnsDevice: design ? conditionsOf(design).some((c) => /motion|tilt/.test(conditionConfig(design, c).technique)) : true,
    panelParam: study.panelParam,
  };
}

/** The session a visitor cookie remembers, if it is still this study's and was not withdrawn or revoked. */
export async function rememberedVisit(q: Queryable, studyId: number, cookieToken: string | undefined): Promise<string | null> {
  if (!cookieToken) return null;
  const ctx = await fetchSessionByToken(q, cookieToken);
  if (!ctx || ctx.study.id !== studyId || ctx.participant.revoked_at || ctx.participant.source !== "public") return null;
  return cookieToken;
}
