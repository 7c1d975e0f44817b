export { detectDocumentType, DOCUMENT_TYPES, DOCUMENT_LIMIT_BYTES, type DocumentMime } from "./detectDocumentType";
export { STORAGE_KEY_PATTERN, assertStorageKey, type BlobStore } from "./blobStore";
export { localStore } from "./localStore";
export { s3Store, type S3StoreConfig } from "./s3Store";
