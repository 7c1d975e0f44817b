import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { db } from "@/lib/db";
import { fetchSessionByToken, fetchSessionState } from "@/lib/data/participants";
import { SessionApp } from "@/components/participant/SessionApp";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Study session", robots: { index: false, follow: false } };

/** A participant's session: reachable only with its unguessable link token (no account, not behind the proxy). */
export default async function SessionPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const ctx = await fetchSessionByToken(db, token);
  if (!ctx) notFound();
  const state = await fetchSessionState(db, ctx);
  return <SessionApp token={token} initial={state} />;
}
