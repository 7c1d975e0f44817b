import { createHmac, hkdfSync } from "node:crypto";
import { env } from "@/lib/env";
import { dataKeyFrom, openText, sealText } from "./sealText";

let cached: Buffer | null = null;
const key = () => (cached ??= dataKeyFrom(env.PARTICIPANT_DATA_KEY));

/** Encrypts with the configured PARTICIPANT_DATA_KEY. */
export const sealWithDataKey = (plain: string) => sealText(plain, key());
let hmacKey: Buffer | null = null;
/**
 * A keyed hash (HMAC-SHA-256, RFC 2104) under a subkey derived from PARTICIPANT_DATA_KEY with
 * HKDF (RFC 5869): finds an identifier again (a panel's participant id) without keeping it in
 * clear or decrypting every row; without the key it cannot be tested against guesses.
 */
export const keyedHashWithDataKey = (text: string) =>
  createHmac("sha256", (hmacKey ??= Buffer.from(hkdfSync("sha256", key(), Buffer.alloc(0), "yawpoint keyed hash", 32)))).update(text, "utf8").digest("hex");
/** Decrypts with the configured PARTICIPANT_DATA_KEY. */
export const openWithDataKey = (sealed: string) => openText(sealed, key());
