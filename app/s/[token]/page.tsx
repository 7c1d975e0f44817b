import type { Metadata, Viewport } from "next";
import { notFound } from "next/navigation";
import { db } from "@/lib/db";
import { fetchSessionByToken, fetchSessionState, revokedError } from "@/lib/data/participants";
import { SessionApp } from "@/components/participant/SessionApp";

export const dynamic = "force-dynamic";
export const metadata: Metadata = {
  title: "Study session",
  robots: { index: false, follow: false },
  // no start_url in the manifest: a session added to the home screen opens its own link
  manifest: "/participant.webmanifest",
  icons: { icon: [{ url: "/icons/yawpoint.svg", type: "image/svg+xml" }, { url: "/icons/icon-192.png", sizes: "192x192" }], apple: "/icons/apple-touch-icon.png" },
  appleWebApp: { capable: true, title: "Study session", statusBarStyle: "default" },
};
// the page may draw under notches and rounded corners; the on-screen controls keep to the safe area
export const viewport: Viewport = { width: "device-width", initialScale: 1, viewportFit: "cover", themeColor: "#1d4ed8" };

/** A participant's session: reachable only with its unguessable link token (no account, not behind the proxy). */
export default async function SessionPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const ctx = await fetchSessionByToken(db, token);
  if (!ctx) notFound();
  if (ctx.participant.revoked_at) {
    // an invitation the team revoked before it was used: say so at once, not after the first click
    return (
      <main className="mx-auto max-w-xl space-y-3 p-4">
        <h1 className="text-xl font-semibold">This link no longer opens a session</h1>
        <p data-testid="invitation-revoked">{revokedError().message} If you think this is a mistake, please write to the researcher who invited you.</p>
      </main>
    );
  }
  const state = await fetchSessionState(db, ctx);
  return <SessionApp token={token} initial={state} />;
}
