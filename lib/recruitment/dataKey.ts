import { env } from "@/lib/env";
import { dataKeyFrom, openText, sealText } from "./sealText";

let cached: Buffer | null = null;
const key = () => (cached ??= dataKeyFrom(env.PARTICIPANT_DATA_KEY));

/** Encrypts with the configured PARTICIPANT_DATA_KEY. */
export const sealWithDataKey = (plain: string) => sealText(plain, key());
/** Decrypts with the configured PARTICIPANT_DATA_KEY. */
export const openWithDataKey = (sealed: string) => openText(sealed, key());
