import { requireRole } from "@/lib/auth/guards";
import { env } from "@/lib/env";
import { fetchFakeMessages, messagesForViewer } from "@/lib/mail/fake";
import type { FakeMessage } from "@/lib/mail/fake-message";
import { getCurrentUser } from "@/lib/session";

export const metadata = { title: "Mail (development)" };
export const dynamic = "force-dynamic";

export default async function MailPage() {
  const admin = requireRole(await getCurrentUser(), "admin");
  if (!env.MAIL_FAKE) return <p className="text-sm">Mail goes to the configured SMTP server; there is no local copy to show.</p>;
  let messages: FakeMessage[] = [];
  let problem: string | null = null;
  try {
    messages = messagesForViewer(await fetchFakeMessages(), admin.email).reverse();
  } catch {
    problem = "The local mail fake does not answer. Start it with npm run mail:fake.";
  }
  return (
    <section className="space-y-4">
      <h1>Mail sent by this installation</h1>
      <p className="text-sm text-slate-700">In development every message goes to a local SMTP fake and is kept here; nothing leaves the machine. Links that act for their recipient (choosing a password, a participant&apos;s session) are hidden in messages to others.</p>
      {problem && <p className="notice">{problem}</p>}
      {messages.length === 0 && !problem && <p className="text-sm">No messages yet.</p>}
      <ul className="space-y-3">
        {messages.map((m) => (
          <li key={m.id} className="card">
            <p className="text-sm"><strong>{m.subject}</strong></p>
            <p className="text-xs text-slate-600">To {m.to.join(", ")} · {m.receivedAt}</p>
            <pre className="mt-2 whitespace-pre-wrap break-words text-sm">{m.text}</pre>
          </li>
        ))}
      </ul>
    </section>
  );
}
