import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import type { ReactNode } from "react";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Yawpoint", template: "%s · Yawpoint" },
  description: "Motion-sensor aiming studies, from protocol to open data.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

/** Every page renders per request, so Next.js can give its scripts the request's CSP nonce (proxy.ts). */
export default async function RootLayout({ children }: { children: ReactNode }) {
  await connection();
  return (
    <html lang="en">
      <body className="min-h-screen font-sans">{children}</body>
    </html>
  );
}
