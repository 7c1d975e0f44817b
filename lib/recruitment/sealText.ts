import { createCipheriv, createDecipheriv, createHash, randomBytes } from "node:crypto";

/** The 32-byte AES key from the configured key material (SHA-256 of the string). Cost: O(1). */
export function dataKeyFrom(material: string): Buffer {
  return createHash("sha256").update(material, "utf8").digest();
}

/**
 * Encrypts a short text at rest (sealText) with AES-256-GCM (NIST SP 800-38D): a fresh 96-bit
 * IV per text, the 128-bit tag kept, stored as base64 "iv.tag.ciphertext".
 * Cost: O(length). @throws Error when the key is not 32 bytes.
 * @example sealText("a@b.example", key) // "kX3…==.Qm9…==.c2V…" (differs every call)
 */
export function sealText(plain: string, key: Buffer): string {
  if (key.length !== 32) throw new Error(`sealText requires a 32-byte key, got ${key.length}`);
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", key, iv);
  const body = Buffer.concat([cipher.update(plain, "utf8"), cipher.final()]);
  return [iv, cipher.getAuthTag(), body].map((b) => b.toString("base64")).join(".");
}

/**
 * Decrypts what sealText produced (openText); GCM's tag check refuses any altered byte.
 * Cost: O(length). @throws Error "openText: the sealed text is malformed" or when authentication fails.
 * @example openText(sealText("x", key), key) // "x"
 */
export function openText(sealed: string, key: Buffer): string {
  const parts = sealed.split(".");
  if (parts.length !== 3) throw new Error("openText: the sealed text is malformed");
  const [iv, tag, body] = parts.map((p) => Buffer.from(p, "base64")) as [Buffer, Buffer, Buffer];
  if (iv.length !== 12 || tag.length !== 16) throw new Error("openText: the sealed text is malformed");
  const decipher = createDecipheriv("aes-256-gcm", key, iv);
  decipher.setAuthTag(tag);
  return Buffer.concat([decipher.update(body), decipher.final()]).toString("utf8");
}
