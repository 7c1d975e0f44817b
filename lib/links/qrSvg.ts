import QRCode from "qrcode";

/**
 * A QR code of `text` as an SVG document (qrSvg), with the qrcode package (ISO/IEC 18004 symbols):
 * error correction level M (about 15 % of the symbol can be lost), a quiet zone of 4 modules as
 * the standard asks, dark on light for phone cameras.
 * Cost: O(length of text).
 * @throws Error from qrcode when the text does not fit any symbol version.
 * @example await qrSvg("https://lab.example/go/K7QM2XHP") // "<svg xmlns=…"
 */
export async function qrSvg(text: string): Promise<string> {
  return QRCode.toString(text, { type: "svg", errorCorrectionLevel: "M", margin: 4, color: { dark: "#0f172a", light: "#ffffff" } });
}

/** The same QR code as a data: URL, for an <img> (the page's CSP allows data: images). */
export async function qrDataUrl(text: string): Promise<string> {
  return `data:image/svg+xml;base64,${Buffer.from(await qrSvg(text), "utf8").toString("base64")}`;
}
