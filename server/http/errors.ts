import { z } from "zod";

/** The closed set of error codes the API answers with, each mapped to its status on purpose. */
export const ERROR_STATUS = {
  validation: 400,
  unauthenticated: 401,
  invalid_credentials: 401,
  forbidden: 403,
  cross_site: 403,
  not_found: 404,
  conflict: 409,
  stale: 409,
  unsupported_media_type: 415,
  gate_unmet: 422,
  rate_limited: 429,
} as const;
export type ErrorCode = keyof typeof ERROR_STATUS;

export class ApiError extends Error {
  constructor(
    public readonly code: ErrorCode,
    message: string,
    public readonly details?: unknown,
    public readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
  get status() {
    return ERROR_STATUS[this.code];
  }
}

export type FieldErrors = Record<string, string[]>;

/** zod issues as `{ "tank.lengthIn": ["…"] }`, the shape forms show beside each field. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export function validationError(error: z.ZodError): ApiError {
  const fields = fieldErrors(error);
  const names = Object.keys(fields).filter((k) => k !== "_");
  const message = names.length
    ? `${fields[names[0]][0]}${names.length > 1 ? ` (and ${names.length - 1} more field${names.length > 2 ? "s" : ""} to fix)` : ""}`
    : (fields._?.[0] ?? "The request is not valid.");
  return new ApiError("validation", message, { fields });
}

export function notFound(what: string) {
  return new ApiError("not_found", `${what} was not found.`);
}
