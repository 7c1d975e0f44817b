import { NextResponse } from "next/server";
import { ZodError } from "zod";
import { AppError } from "@/lib/errors";

/** The error body every JSON route answers with. */
export type ApiErrorBody = { error: { code: string; message: string; issues?: unknown } };

export function errorResponse(status: number, code: string, message: string, issues?: unknown): NextResponse<ApiErrorBody> {
  return NextResponse.json({ error: issues === undefined ? { code, message } : { code, message, issues } }, { status });
}

/** Maps anything thrown in a handler to the API's error shape: AppError → its status, ZodError → 422, else 500. */
export function toErrorResponse(error: unknown): NextResponse<ApiErrorBody> {
  if (error instanceof AppError) return errorResponse(error.status, error.code, error.message, error.issues);
  if (error instanceof ZodError) {
    const issues = error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
    const first = issues[0];
    return errorResponse(422, "invalid", first ? `${first.path || "body"}: ${first.message}` : "Invalid input.", issues);
  }
  console.error(error);
  return errorResponse(500, "internal", "Something went wrong on the server.");
}

type Handler<C> = (request: Request, context: C) => Promise<Response>;

/** Wraps a route handler so every error leaves in the API's shape. */
export function route<C>(handler: Handler<C>): Handler<C> {
  return async (request, context) => {
    try {
      return await handler(request, context);
    } catch (error) {
      return toErrorResponse(error);
    }
  };
}
