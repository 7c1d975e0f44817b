/** Where protocol documents' bytes live: a local directory or an S3-compatible bucket. */
export interface BlobStore {
  readonly kind: "local" | "s3";
  put(key: string, bytes: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<Buffer>;
  delete(key: string): Promise<void>;
}

/** Keys are our own: "documents/<study>/<uuid>.<ext>"; anything else is refused. */
export const STORAGE_KEY_PATTERN = /^[a-z]+\/\d+\/[0-9a-f-]{36}\.(pdf|png|jpg)$/;

export function assertStorageKey(key: string): void {
  if (!STORAGE_KEY_PATTERN.test(key)) throw new Error(`storage key "${key}" is not one the store makes`);
}
