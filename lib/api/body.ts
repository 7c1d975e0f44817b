import type { z } from "zod";
import { badRequest, tooLarge, unsupportedType } from "@/lib/errors";

/** JSON bodies above this are refused with 413. */
export const JSON_BODY_LIMIT = 1024 * 1024;

/**
 * Reads a JSON body with a size limit, then validates it with the schema.
 * @throws AppError 415 (not JSON), 413 (over the limit), 400 (malformed JSON); ZodError (→ 422).
 */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/json")) throw unsupportedType("Send the body as application/json.");
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > JSON_BODY_LIMIT) throw tooLarge(`The body is over the ${JSON_BODY_LIMIT} byte limit.`);
  const text = await readLimited(request, JSON_BODY_LIMIT);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw badRequest(`Malformed JSON: ${e instanceof Error ? e.message : String(e)}`);
  }
  return schema.parse(value);
}

/**
 * An HTML form's urlencoded body (application/x-www-form-urlencoded), read up to `limit` bytes.
 * @throws AppError 415 (another content type), 413 (over the limit).
 */
export async function readForm(request: Request, limit = 4096): Promise<URLSearchParams> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/x-www-form-urlencoded")) throw unsupportedType("Send the form as application/x-www-form-urlencoded.");
  if (Number(request.headers.get("content-length") ?? "0") > limit) throw tooLarge(`The form is over the ${limit} byte limit.`);
  return new URLSearchParams(await readLimited(request, limit));
}

async function readLimited(request: Request, limit: number): Promise<string> {
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel();
      throw tooLarge(`The body is over the ${limit} byte limit.`);
    }
    chunks.push(value);
  }
  return new TextDecoder().decode(Buffer.concat(chunks));
}

/** Parses route params (or search params) with a schema; a failure is a 422 through ZodError. */
export function parseParams<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  return schema.parse(value);
}

/**
 * Reads a multipart/form-data body into FormData, but never more than `limit` bytes of it
 * (readFormLimited): the bytes are counted as they arrive, whatever Content-Length says or when
 * it is missing (chunked), and reading stops at the limit.
 * @throws AppError 413 past the limit, 400 when the body is not a readable form.
 */
export async function readFormLimited(request: Request, limit: number): Promise<FormData> {
  if (!request.body) throw badRequest("The request has no body.");
  let size = 0, exceeded = false;
  const counted = request.body.pipeThrough(new TransformStream<Uint8Array, Uint8Array>({
    transform(chunk, controller) {
      size += chunk.byteLength;
      if (size > limit) {
        exceeded = true;
        controller.error(tooLarge(`The body is over the ${limit} byte limit.`));
        return;
      }
      controller.enqueue(chunk);
    },
  }));
  try {
    return await new Response(counted, { headers: { "content-type": request.headers.get("content-type") ?? "" } }).formData();
  } catch {
    if (exceeded) throw tooLarge(`The body is over the ${limit} byte limit.`);
    throw badRequest("The upload could not be read as a form.");
  }
}
