import { createHash, createDecipheriv } from "node:crypto";
import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import S3rver from "s3rver";
import { consentChecklist, consentDiff, missingConsentElements, sha256Text } from "@/lib/consent";
import { dataKeyFrom, invitationsCsv, newCompletionCode, newParticipantCode, openText, sealText, PARTICIPANT_CODE_PATTERN } from "@/lib/recruitment";
import { detectDocumentType, localStore, s3Store } from "@/lib/storage";
import { designSummary } from "@/lib/study/summary";
import { studyDesignSchema } from "@/lib/study/design";
import { designHash } from "@/lib/study/designHash";

describe("sha256Text", () => {
  it("matches FIPS 180-2 Appendix B.1 (SHA-256 of 'abc') and Node's crypto on UTF-8 text", () => {
    expect(sha256Text("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"); // FIPS 180-2, B.1
    const text = "Einwilligung — Teilnahme freiwillig ✓\r\n";
    expect(sha256Text(text)).toBe(createHash("sha256").update(Buffer.from(text, "utf8")).digest("hex")); // node:crypto reference
    expect(sha256Text("a\n")).not.toBe(sha256Text("a\r\n")); // the exact text, line endings included
  });
});

describe("consentChecklist — basic elements of informed consent, US Common Rule 45 CFR 46.116(b)", () => {
  it("flags every element in an empty-ish text and none in a complete one", () => {
    expect(missingConsentElements("Hello.")).toHaveLength(consentChecklist("").length);
    const full = "Purpose. Procedures. Duration: 20 minutes. Risks: wrist strain, motion sickness, flashing. Benefits: none. Compensation: a voucher. Confidentiality. Participation is voluntary; you may withdraw. Contact lab@x.example.";
    expect(missingConsentElements(full)).toEqual([]);
  });
  it("names the three cautions of motion aiming separately", () => {
    const missing = missingConsentElements("Purpose. Risks: none known.");
    expect(missing).toContain("Risk: wrist or hand strain from repeated rotation");
    expect(missing).toContain("Risk: motion sickness from view rotation");
    expect(missing).toContain("Risk: flashing highlights (photosensitivity)");
    expect(missing).not.toContain("Risks and discomforts");
  });
});

describe("consentDiff (the diff package, Myers 1986)", () => {
  it("reassembles both texts from the parts", () => {
    const a = "one\ntwo\nthree\n", b = "one\nTWO\nthree\nfour\n";
    const parts = consentDiff(a, b);
    expect(parts.filter((p) => p.kind !== "added").map((p) => p.text).join("")).toBe(a);
    expect(parts.filter((p) => p.kind !== "removed").map((p) => p.text).join("")).toBe(b);
  });
});

describe("sealText — AES-256-GCM (NIST SP 800-38D) with node:crypto", () => {
  const key = dataKeyFrom("unit-test-key-material");
  it("round-trips, uses a fresh IV each time, and decrypts with a plain createDecipheriv (independent reader)", () => {
    const a = sealText("volunteer@mailbox.example", key);
    expect(a).not.toBe(sealText("volunteer@mailbox.example", key));
    expect(openText(a, key)).toBe("volunteer@mailbox.example");
    const [iv, tag, body] = a.split(".").map((p) => Buffer.from(p, "base64")) as [Buffer, Buffer, Buffer];
    const d = createDecipheriv("aes-256-gcm", key, iv);
    d.setAuthTag(tag);
    expect(Buffer.concat([d.update(body), d.final()]).toString()).toBe("volunteer@mailbox.example");
  });
  it("refuses a changed byte or another key", () => {
    const s = sealText("x@y.example", key);
    const [iv, tag, body] = s.split(".");
    const flipped = Buffer.from(body!, "base64");
    flipped[0] = flipped[0]! ^ 1;
    expect(() => openText([iv, tag, flipped.toString("base64")].join("."), key)).toThrow();
    expect(() => openText(s, dataKeyFrom("another key material"))).toThrow();
    expect(() => openText("nonsense", key)).toThrow("openText: the sealed text is malformed");
  });
});

describe("codes", () => {
  it("participant codes are P- and 6 unambiguous characters; completion codes 5-5", () => {
    for (let i = 0; i < 200; i++) {
      expect(newParticipantCode()).toMatch(PARTICIPANT_CODE_PATTERN);
      expect(newCompletionCode()).toMatch(/^[23456789A-HJKMNP-Z]{5}-[23456789A-HJKMNP-Z]{5}$/);
    }
  });
  it("the links CSV follows RFC 4180 (CRLF, quoted commas)", () => {
    expect(invitationsCsv([{ code: "P-ABCDEF", link: "http://h/s/t,1", completionCode: "AAAAA-BBBBB" }])).toBe('participant,link,completion_code\r\nP-ABCDEF,"http://h/s/t,1",AAAAA-BBBBB\r\n');
  });
});

describe("designSummary and designHash", () => {
  const d = studyDesignSchema.parse({
    factors: [{ name: "technique", levels: [{ label: "motion" }, { label: "stick", config: { technique: "stick" } }] }],
    task: { amplitudes: [256], widths: [32, 64], targetsPerRing: 9, sequencesPerAW: 2 },
    blocks: 2,
    counterbalancing: { method: "williams", seed: 1 },
  });
  it("counts 2 conditions × 2 A×W × 2 sequences × 2 blocks × 9 movements = 144 trials, IDs by the Shannon formulation", () => {
    const s = designSummary(d);
    expect(s.trialsPerParticipant).toBe(144);
    expect(s.difficulties[0]!.id).toBeCloseTo(Math.log2(256 / 32 + 1), 12); // ISO 9241-411: ID = log2(A/W + 1)
  });
  it("designHash ignores key order (RFC 8785 canonical JSON)", () => {
    const reordered = Object.fromEntries(Object.entries(d).reverse()) as typeof d;
    expect(Object.keys(reordered)[0]).not.toBe(Object.keys(d)[0]);
    expect(designHash(reordered)).toBe(designHash(d));
    expect(designHash({ ...d, blocks: 3 })).not.toBe(designHash(d));
  });
});

describe("documents: magic bytes (file-type) and both stores", () => {
  const pdf = Buffer.from("%PDF-1.7\n%%EOF\n");
  const png = Buffer.from("89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8ffff3f0005fe02fea7d6a4d50000000049454e44ae426082", "hex"); // a 1×1 PNG (PNG spec signature)
  const jpeg = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01]); // JFIF header (ITU T.81 SOI + APP0)
  it("accepts PDF, PNG and JPEG by content, refuses the rest", async () => {
    expect(await detectDocumentType(pdf)).toBe("application/pdf");
    expect(await detectDocumentType(png)).toBe("image/png");
    expect(await detectDocumentType(jpeg)).toBe("image/jpeg");
    expect(await detectDocumentType(Buffer.from("<html>not a pdf</html>"))).toBeNull();
    expect(await detectDocumentType(Buffer.from("PK\u0003\u0004zipfile"))).toBeNull();
  });

  it("local store: put/get/delete, refuses foreign keys", async () => {
    const store = localStore(await mkdtemp(join(tmpdir(), "yawpoint-store-")));
    const key = "documents/7/0f8fad5b-d9cb-469f-a165-70867728950e.pdf";
    await store.put(key, pdf, "application/pdf");
    expect((await store.get(key)).equals(pdf)).toBe(true);
    await expect(store.put("../../etc/passwd", pdf, "x")).rejects.toThrow(/not one the store makes/);
    await store.delete(key);
    await expect(store.get(key)).rejects.toThrow();
  });

  describe("S3 store against a local fake (s3rver)", () => {
    let server: S3rver;
    let port = 0;
    beforeAll(async () => {
      const dir = await mkdtemp(join(tmpdir(), "yawpoint-s3-"));
      server = new S3rver({ port: 0, address: "127.0.0.1", silent: true, directory: dir, configureBuckets: [{ name: "protocol-docs", configs: [] }] });
      const addr = await server.run();
      port = addr.port;
    });
    afterAll(async () => {
      await server.close();
    });
    it("put, get and delete through the AWS SDK", async () => {
      const store = s3Store({ bucket: "protocol-docs", endpoint: `http://127.0.0.1:${port}`, region: "us-east-1", accessKeyId: "S3RVER", secretAccessKey: "S3RVER", forcePathStyle: true });
      const key = "documents/9/1b4e28ba-2fa1-11d2-883f-0016d3cca427.png";
      await store.put(key, png, "image/png");
      expect((await store.get(key)).equals(png)).toBe(true);
      await store.delete(key);
      await expect(store.get(key)).rejects.toThrow();
    });
  });
});
