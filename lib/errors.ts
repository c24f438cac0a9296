import type { z } from "zod";

/** Domain errors that carry the HTTP status a route handler should answer with. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class ValidationError extends HttpError {
  constructor(message: string, details?: unknown) {
    super(422, "invalid_input", message, details);
  }
  static fromZod(error: z.ZodError, message = "Some fields need attention"): ValidationError {
    const fields: Record<string, string[]> = {};
    for (const issue of error.issues) {
      const key = issue.path.join(".") || "_";
      (fields[key] ??= []).push(issue.message);
    }
    return new ValidationError(message, { fields });
  }
}

export class UnauthenticatedError extends HttpError {
  constructor(message = "Sign in to continue") {
    super(401, "unauthenticated", message);
  }
}

export class ForbiddenError extends HttpError {
  constructor(message = "Your role in this crew does not allow that") {
    super(403, "forbidden", message);
  }
}

/** Also used for records of another crew, so their existence is not revealed. */
export class NotFoundError extends HttpError {
  constructor(what = "Record") {
    super(404, "not_found", `${what} not found`);
  }
}

export class ConflictError extends HttpError {
  constructor(message: string) {
    super(409, "conflict", message);
  }
}

export class RateLimitedError extends HttpError {
  constructor(message: string, readonly retryAfterS: number) {
    super(429, "rate_limited", message);
  }
}

export class ServiceUnavailableError extends HttpError {
  constructor(message = "A service Sortie depends on is not answering; try again shortly") {
    super(503, "unavailable", message);
  }
}

/** The object store refused or dropped the connection (lib/storage/s3.ts). */
export class StorageUnavailableError extends ServiceUnavailableError {
  constructor(readonly cause?: unknown) {
    super("File storage is not answering; nothing is lost, try again shortly");
  }
}
