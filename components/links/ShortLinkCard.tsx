/** What a short link shows: its QR code, the address to type, and when it stops working. */
export type ShortLinkView = { code: string; url: string; expiresAt: string; qrDataUrl: string };

/**
 * A short link with its QR code (lib/data/shortLinks.ts makes them): scan it with a phone's camera,
 * or type the address. Shared by pilots and "try this level".
 */
export function ShortLinkCard({ link, title, note }: { link: ShortLinkView; title: string; note?: string }) {
  const until = new Date(link.expiresAt);
  return (
    <div className="card flex flex-wrap items-start gap-4" data-testid="short-link">
      {/* eslint-disable-next-line @next/next/no-img-element -- a data: URL made on the server, no optimisation to do */}
      <img src={link.qrDataUrl} alt={`QR code for ${link.url}`} width={180} height={180} className="rounded border border-slate-300" />
      <div className="min-w-[14rem] flex-1 space-y-1 text-sm">
        <h3 className="font-semibold">{title}</h3>
        <p>Scan the code with the phone&apos;s camera, or type this address:</p>
        <p><a href={link.url} className="break-all font-mono text-base" data-testid="short-link-url">{link.url}</a></p>
        <p>Works until {until.toISOString().slice(11, 16)} UTC ({until.toISOString().slice(0, 10)}).</p>
        {note && <p className="text-slate-700">{note}</p>}
      </div>
    </div>
  );
}
