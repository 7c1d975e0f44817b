import { mkdir, readFile, rm, writeFile } from "node:fs/promises";
import { dirname, join, resolve } from "node:path";
import { assertStorageKey, type BlobStore } from "./blobStore";

/** A BlobStore in a local directory (the default: STORAGE_DIR). */
export function localStore(root: string): BlobStore {
  const base = resolve(root);
  const pathOf = (key: string) => {
    assertStorageKey(key);
    return join(base, key);
  };
  return {
    kind: "local",
    async put(key, bytes) {
      const p = pathOf(key);
      await mkdir(dirname(p), { recursive: true });
      await writeFile(p, bytes, { flag: "wx" });
    },
    get: (key) => readFile(pathOf(key)),
    delete: (key) => rm(pathOf(key), { force: true }),
  };
}
