import type { Metadata } from "next";
import { db } from "@/lib/db";
import { fetchLevelTry } from "@/lib/data/levelTries";
import { TryLevel } from "@/components/study/try/TryLevel";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Try a level", robots: { index: false, follow: false } };

/**
 * "Try this level": the runner's task at one condition's settings, for the researcher on this
 * computer or on a phone (through a short link). The token is the credential and expires after an
 * hour; nothing is recorded, there is no consent and no participant.
 */
export default async function TryPage({ params }: { params: Promise<{ token: string }> }) {
  const found = await fetchLevelTry(db, (await params).token);
  if (!found.ok) {
    return (
      <main className="mx-auto max-w-xl space-y-2 p-6">
        <h1>{found.reason === "expired" ? "This try has expired" : "Unknown try link"}</h1>
        <p>A level can be tried for an hour after it was opened from the design page. Open it again there.</p>
      </main>
    );
  }
  return <TryLevel setup={found.setup} expiresAt={found.expiresAt.toISOString()} />;
}
