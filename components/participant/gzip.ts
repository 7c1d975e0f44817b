/**
 * Gzip a text in the browser (gzipText): the platform's CompressionStream (WHATWG Compression
 * Streams, "gzip" = RFC 1952) where it exists, so the page ships no compression code; else the
 * fflate package, loaded only then (a separate chunk).
 */
export async function gzipText(text: string): Promise<Uint8Array> {
  const bytes = new TextEncoder().encode(text);
  if (typeof CompressionStream === "function") {
    try {
      const stream = new Blob([bytes]).stream().pipeThrough(new CompressionStream("gzip"));
      return new Uint8Array(await new Response(stream).arrayBuffer());
    } catch {
      /* a partial implementation: fall back below */
    }
  }
  const { gzipSync } = await import("fflate");
  return gzipSync(bytes, { level: 6 });
}
