/** Domain errors that carry an HTTP status; route handlers and actions map them in one place. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: unknown,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const unauthorized = (message = "Sign in to continue.") => new AppError(401, "unauthorized", message);
export const forbidden = (message = "Your role does not allow this.") => new AppError(403, "forbidden", message);
export const notFound = (message = "Not found.") => new AppError(404, "not_found", message);
export const conflict = (message: string) => new AppError(409, "conflict", message);
export const badRequest = (message: string) => new AppError(400, "bad_request", message);
export const tooLarge = (message: string) => new AppError(413, "too_large", message);
export const unsupportedType = (message: string) => new AppError(415, "unsupported_media_type", message);
export const unprocessable = (message: string, issues?: unknown) => new AppError(422, "invalid", message, issues);
export const tooManyRequests = (message: string) => new AppError(429, "rate_limited", message);
