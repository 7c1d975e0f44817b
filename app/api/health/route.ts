import { db } from "@/lib/db";

export const dynamic = "force-dynamic";

/** Liveness and database check for monitors (public, tells nothing else). */
export async function GET(): Promise<Response> {
  try {
    await db.raw("SELECT 1");
    return Response.json({ ok: true, database: "up" });
  } catch {
    return Response.json({ ok: false, database: "down" }, { status: 503 });
  }
}
