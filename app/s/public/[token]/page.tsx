import type { Metadata } from "next";
import { cookies } from "next/headers";
import { notFound } from "next/navigation";
import { db } from "@/lib/db";
import { PANEL_ID_PATTERN, publicStudyInfo, rememberedVisit, visitorCookieName } from "@/lib/recruitment/publicVisit";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Study information", robots: { index: false, follow: false } };

/**
 * A study's public link: the information page only. Opening it (a link preview, a mail scanner, a
 * curious click) creates nothing; "Start" posts the form, and only then a participant is made.
 */
export default async function PublicLinkPage({ params, searchParams }: { params: Promise<{ token: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { token } = await params;
  if (!/^[A-Za-z0-9_-]{16,64}$/.test(token)) notFound();
  const info = await publicStudyInfo(db, token);
  if (!info) notFound();
  const query = await searchParams;
  const rawPanel = info.panelParam ? query[info.panelParam] : undefined;
  const panelId = typeof rawPanel === "string" && PANEL_ID_PATTERN.test(rawPanel.trim()) ? rawPanel.trim() : null;
  const resumed = await rememberedVisit(db, info.studyId, (await cookies()).get(visitorCookieName(info.studyId))?.value);
  return (
    <main className="mx-auto max-w-xl space-y-4 p-4">
      <h1 className="text-xl font-semibold">{info.title}</h1>
      <p className="whitespace-pre-line">{info.summary}</p>
      <ul className="list-disc pl-5 text-sm">
        {info.minutes !== null && <li>It takes about {info.minutes} minutes, with breaks.</li>}
        <li>Compensation: {info.compensation || "none is offered for this study."}</li>
      </ul>
      <div className="notice space-y-1" role="note">
        <h2 className="font-semibold">Before you start</h2>
        <ul className="list-disc pl-5">
          {info.turnsDevice
            ? <li>You will aim at targets by turning your own device. Repeated wrist rotation can strain: rest whenever you need to.</li>
            : <li>You will aim at targets on your own device. Many quick, precise movements can tire the hand: rest whenever you need to.</li>}
          {info.viewMode && <li>The view turns as you move. Turning views can cause motion sickness: stop at once if you feel unwell.</li>}
          <li>Targets are highlighted. If bright, changing highlights affect you (photosensitivity), do not take part.</li>
          <li>Taking part is voluntary. The next pages explain the study in full and ask for your consent; you can stop at any time.</li>
        </ul>
      </div>
      {!info.recruiting ? (
        <p className="notice">This study is not taking participants at the moment.</p>
      ) : resumed ? (
        <p><a className="btn" href={`/s/${resumed}`}>Continue where you left off</a></p>
      ) : (
        <form method="post" action={`/api/public/${token}`}>
          {panelId && <input type="hidden" name="panel_id" value={panelId} />}
          <button className="btn w-full sm:w-auto">Start</button>
        </form>
      )}
    </main>
  );
}
