import { env } from "@/lib/env";
import type { BlobStore } from "./blobStore";
import { localStore } from "./localStore";
import { s3Store } from "./s3Store";

/** The configured store: the S3 bucket when S3_BUCKET is set, else the local STORAGE_DIR. */
export function storeFromEnv(): BlobStore {
  if (env.S3_BUCKET) {
    return s3Store({
      bucket: env.S3_BUCKET,
      endpoint: env.S3_ENDPOINT,
      region: env.S3_REGION,
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
      forcePathStyle: env.S3_FORCE_PATH_STYLE,
    });
  }
  return localStore(env.STORAGE_DIR);
}
