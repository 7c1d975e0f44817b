import QRCode from "qrcode";
import { describe, expect, it } from "vitest";
import { newShortCode, normaliseShortCode, SHORT_CODE_PATTERN } from "./shortCode";
import { qrSvg } from "./qrSvg";

describe("short codes", () => {
  it("are 8 characters without 0, O, 1, I or L, and typed codes are forgiven case, spaces and dashes", () => {
    for (let i = 0; i < 200; i++) {
      const c = newShortCode();
      expect(c).toMatch(SHORT_CODE_PATTERN);
      expect(c).not.toMatch(/[01OIL]/);
    }
    expect(normaliseShortCode(" k7qm-2xhp ")).toBe("K7QM2XHP");
    expect(normaliseShortCode("K7QM2XH0")).toBeNull(); // a zero is never in a code
    expect(normaliseShortCode("K7QM2XHPP")).toBeNull();
  });
});

describe("QR codes of short links", () => {
  // ISO/IEC 18004:2015 Table 7 (from memory): byte-mode capacity at error correction level M is
  // 14 characters for version 1, 26 for version 2, 42 for version 3, 62 for version 4; a symbol of
  // version V is 17 + 4V modules wide (§5.3.1). A short link of 33 characters needs version 3.
  it("a 33-character short link is a version 3 symbol, 29 modules wide", () => {
    const url = "http://127.0.0.1:3600/go/K7QM2XHP";
    expect(url).toHaveLength(33);
    const symbol = QRCode.create(url, { errorCorrectionLevel: "M" });
    expect(symbol.version).toBe(3);
    expect(symbol.modules.size).toBe(29);
  });

  it("a 27-character text no longer fits version 2 at level M, a 26-character one does", () => {
    expect(QRCode.create("x".repeat(26), { errorCorrectionLevel: "M" }).version).toBe(2);
    expect(QRCode.create("x".repeat(27), { errorCorrectionLevel: "M" }).version).toBe(3);
  });

  it("draws the symbol with the 4-module quiet zone the standard asks for (viewBox 29 + 2·4 = 37)", async () => {
    const svg = await qrSvg("http://127.0.0.1:3600/go/K7QM2XHP");
    expect(svg).toContain('viewBox="0 0 37 37"');
  });
});
