import type { Archiver } from "archiver";

type ZipEngine = {
  write(chunk: Buffer | string): boolean;
  _writeCentralFileHeader(entry: unknown): void;
  _afterAppend(entry: unknown): void;
  _entries: unknown[];
};

/** Size of the blocks the central directory is kept in and written as. */
const BLOCK_BYTES = 64 * 1024;

/**
 * Keeps archiver's central directory as bytes instead of entry objects (batchCentralDirectory).
 *
 * Why: compress-commons (archiver 8's ZIP layer) keeps every finished entry object (name, general
 * purpose bits, offsets, extra field…) until finalize, then writes each central-directory record
 * as ~18 small synchronous writes without waiting for the output to drain. With tens of thousands
 * of stream files both the kept objects and that write queue cost hundreds of MB. Here each
 * record is produced by archiver's own writer as soon as its entry is complete (CRC, sizes and
 * local-header offset are final then), copied into 64 KiB blocks, and the entry object is
 * replaced by its index; at finalize the blocks are written in order. The bytes are identical:
 * the same writer fills the same record from the same fields, and the offset is counted by the
 * same `write`. The record layout is PKWARE APPNOTE §4.3.12.
 * Cost: O(record size) per entry; memory ≈ the central directory's size (~90 bytes per entry).
 * @throws never; a writer without the expected methods is left as it is.
 * @example batchCentralDirectory(new ZipArchive()) // the same archive, leaner at finalize
 */
export function batchCentralDirectory(archive: Archiver): Archiver {
  // archiver 8: the ZipArchive's plugin (_module) holds the zip-stream writer as `engine`
  const zip = (archive as unknown as { _module?: { engine?: Partial<ZipEngine> } })._module?.engine as ZipEngine | undefined;
  if (!zip || typeof zip._writeCentralFileHeader !== "function" || typeof zip._afterAppend !== "function" || !Array.isArray(zip._entries)) return archive;
  const writeRecord = zip._writeCentralFileHeader.bind(zip);
  const afterAppend = zip._afterAppend.bind(zip);
  const blocks: Buffer[] = [];
  let block = Buffer.allocUnsafe(BLOCK_BYTES);
  let used = 0;
  let flushed = false;
  /** The entry whose record was kept last (finalize can run inside its own append). */
  let lastKept: unknown = null;

  const keep = (bytes: Buffer): void => {
    let from = 0;
    while (from < bytes.length) {
      if (used === BLOCK_BYTES) {
        blocks.push(block);
        block = Buffer.allocUnsafe(BLOCK_BYTES);
        used = 0;
      }
      const n = bytes.copy(block, used, from);
      used += n;
      from += n;
    }
  };
  /** Runs archiver's record writer with `write` redirected; the real write (and offset) is untouched. */
  const recordInto = (entry: unknown, sink: (bytes: Buffer) => void): void => {
    const write = zip.write;
    zip.write = (chunk: Buffer | string): boolean => {
      sink(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk));
      return true;
    };
    try {
      writeRecord(entry);
    } finally {
      zip.write = write;
    }
  };
  const flush = (): void => {
    if (flushed) return;
    flushed = true;
    for (const b of blocks) zip.write(b);
    blocks.length = 0;
    if (used > 0) zip.write(Buffer.from(block.subarray(0, used)));
    block = Buffer.alloc(0);
    used = 0;
  };

  zip._afterAppend = (entry: unknown): void => {
    recordInto(entry, keep);
    lastKept = entry;
    const index = zip._entries.length;
    afterAppend(entry); // pushes the entry, writes its data descriptor, may finalize
    if (zip._entries[index] === entry) zip._entries[index] = index;
  };
  zip._writeCentralFileHeader = (entry: unknown): void => {
    if (typeof entry === "number") {
      // records kept in order: all of them go out at the first index
      if (entry === 0) flush();
      return;
    }
    // an entry still held as an object: finalize inside its own append (its record is kept already)
    flush();
    if (entry === lastKept) return;
    const parts: Buffer[] = [];
    recordInto(entry, (b) => parts.push(b));
    zip.write(Buffer.concat(parts));
  };
  return archive;
}
