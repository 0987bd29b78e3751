/**
 * An expected failure with an HTTP status and a stable code. Services throw it;
 * route handlers and server actions turn it into the error shape.
 */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const unauthenticated = () => new AppError(401, "unauthenticated", "Sign in to continue.");
export const forbidden = (what = "do that") => new AppError(403, "forbidden", `Your role does not allow you to ${what}.`);
export const notFound = (what = "Record") => new AppError(404, "not-found", `${what} not found.`);
export const conflict = (message: string, details?: unknown) => new AppError(409, "conflict", message, details);
