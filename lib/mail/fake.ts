import { env } from "@/lib/env";
import type { FakeMessage } from "./fake-message";

/** Messages the local SMTP fake holds (development and tests). */
export async function fetchFakeMessages(): Promise<FakeMessage[]> {
  const res = await fetch(`http://127.0.0.1:${env.MAIL_FAKE_HTTP_PORT}/messages`, { cache: "no-store", signal: AbortSignal.timeout(3000) });
  if (!res.ok) throw new Error(`mail fake answered ${res.status}`);
  return (await res.json()) as FakeMessage[];
}
