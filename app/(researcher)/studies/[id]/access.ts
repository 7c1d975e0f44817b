import { notFound } from "next/navigation";
import { cache } from "react";
import { assertCanViewStudy } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { getCurrentUser } from "@/lib/session";

/** The study for a page of the study area (team members only); 404 for anyone else. Cached per request. */
export const studyForPage = cache(async (rawId: string) => {
  const id = Number(rawId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  try {
    const user = await getCurrentUser();
    const access = await assertCanViewStudy(db, user, id);
    const rank = { viewer: 1, editor: 2, owner: 3 }[access.teamRole ?? "viewer"];
    return { ...access, user: user!, canEdit: rank >= 2, isOwner: rank === 3 };
  } catch (e) {
    if (e instanceof AppError && (e.status === 404 || e.status === 403)) notFound();
    throw e;
  }
});
