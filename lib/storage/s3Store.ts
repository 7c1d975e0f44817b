import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { assertStorageKey, type BlobStore } from "./blobStore";

export type S3StoreConfig = { bucket: string; endpoint?: string; region: string; accessKeyId?: string; secretAccessKey?: string; forcePathStyle: boolean };

/** A BlobStore in an S3-compatible bucket through the AWS SDK (v3). */
export function s3Store(config: S3StoreConfig): BlobStore {
  const client = new S3Client({
    region: config.region,
    endpoint: config.endpoint,
    forcePathStyle: config.forcePathStyle,
    credentials: config.accessKeyId ? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey ?? "" } : undefined,
  });
  return {
    kind: "s3",
    async put(key, bytes, contentType) {
      assertStorageKey(key);
      await client.send(new PutObjectCommand({ Bucket: config.bucket, Key: key, Body: bytes, ContentType: contentType }));
    },
    async get(key) {
      assertStorageKey(key);
      const out = await client.send(new GetObjectCommand({ Bucket: config.bucket, Key: key }));
      if (!out.Body) throw new Error(`storage: ${key} has no body`);
      return Buffer.from(await out.Body.transformToByteArray());
    },
    async delete(key) {
      assertStorageKey(key);
      await client.send(new DeleteObjectCommand({ Bucket: config.bucket, Key: key }));
    },
  };
}
