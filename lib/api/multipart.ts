import { createHash, randomUUID } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, rm } from "node:fs/promises";
import { join } from "node:path";
import { Readable } from "node:stream";
import type { ReadableStream as WebReadableStream } from "node:stream/web";
import busboy from "busboy";
import { badRequest, tooLarge, unsupportedType } from "@/lib/errors";

export type SavedUpload = { path: string; filename: string; size: number; sha256: string; fields: Record<string, string> };

/**
 * Streams the one file part of a multipart/form-data request to `dir` (never whole in memory),
 * hashing it on the way; refuses with 413 past `limit` bytes and removes what was written.
 * @throws AppError 415 (not multipart), 413 (over the limit), 400 (no file part)
 */
export async function saveMultipartFile(request: Request, dir: string, limit: number, field = "file"): Promise<SavedUpload> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data")) throw unsupportedType("Send the file as multipart/form-data.");
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > limit + 64 * 1024) throw tooLarge(`The file is over the ${Math.round(limit / 1024 / 1024)} MB limit.`);
  if (!request.body) throw badRequest("The request has no body.");
  await mkdir(dir, { recursive: true });
  const path = join(dir, `${randomUUID()}.upload`);
  const fields: Record<string, string> = {};
  let saved: Omit<SavedUpload, "fields"> | null = null;

  await new Promise<void>((resolve, reject) => {
    let bb: ReturnType<typeof busboy>;
    try {
      bb = busboy({ headers: { "content-type": type }, limits: { fileSize: limit, files: 1, fields: 20, fieldSize: 10_000 } });
    } catch (e) {
      reject(badRequest(`The form could not be read (${(e as Error).message}).`)); // no boundary, or another malformed type
      return;
    }
    let pending: Promise<void> | null = null;
    bb.on("field", (name, value) => {
      fields[name] = value;
    });
    bb.on("file", (name, stream, info) => {
      if (name !== field) {
        stream.resume();
        return;
      }
      const hash = createHash("sha256");
      let size = 0;
      let truncated = false;
      const out = createWriteStream(path);
      stream.on("data", (chunk: Buffer) => {
        size += chunk.length;
        hash.update(chunk);
      });
      stream.on("limit", () => {
        truncated = true;
      });
      pending = new Promise<void>((res, rej) => {
        out.on("finish", () => {
          if (truncated) rej(tooLarge(`The file is over the ${Math.round(limit / 1024 / 1024)} MB limit.`));
          else {
            saved = { path, filename: info.filename || "upload.csv", size, sha256: hash.digest("hex") };
            res();
          }
        });
        out.on("error", rej);
      });
      stream.pipe(out);
    });
    bb.on("error", (e: unknown) => reject(badRequest(`The form could not be read (${(e as Error).message}).`))); // a malformed body is the client's
    bb.on("close", () => {
      if (pending) pending.then(resolve, reject);
      else resolve();
    });
    Readable.fromWeb(request.body as WebReadableStream<Uint8Array>).pipe(bb);
  }).catch(async (e: unknown) => {
    await rm(path, { force: true });
    throw e;
  });

  if (!saved) throw badRequest(`Attach the file as the form field "${field}".`);
  return { ...(saved as Omit<SavedUpload, "fields">), fields };
}
