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
    ? `${fields[names[0]][0]}${names.length > 1 ? ` ${names.length - 1} more ${names.length > 2 ? "fields need" : "field needs"} fixing too.` : ""}`
    : (fields._?.[0] ?? "The request is not valid.");
  return new ApiError("validation", message, { fields });
}

export function notFound(what: string) {
  return new ApiError("not_found", `${what} was not found.`);
}

/**
 * What each unique column means to the person who sent it, by `table.column` as SQLite names it
 * in "UNIQUE constraint failed: staff.email". The API field is the name the form uses.
 */
const UNIQUE_FIELDS: Record<string, { field: string; message: string }> = {
  "staff.email": { field: "email", message: "Someone on the staff already uses that e-mail." },
  "truck.vin": { field: "vin", message: "That VIN is already on file for another truck." },
  "job.work_order": { field: "workOrder", message: "That work order number is already used; save again to get the next one." },
  "vendor.name": { field: "name", message: "A coater with that name is already on the list." },
  "coating_run_part.part_id": { field: "partIds", message: "One of those parts is already out on another coating run." },
  "purchase_order.number": { field: "partIds", message: "Another purchase order took that number at the same moment; save again to get the next one." },
  "clock_entry.staff_id": { field: "jobId", message: "Your clock was started at the same moment on another device; reload to see which job it is on." },
  "sign_off.job_id": { field: "expectedVersion", message: "Someone saved this sign-off at the same moment; reload it and save again." },
};

/**
 * A unique constraint hit by two requests at once (both passed the check, one insert lost) is a
 * 409 naming the field, never a 500. Returns null for any other error.
 */
export function uniqueConflict(err: unknown): ApiError | null {
  const e = err as { code?: unknown; message?: unknown } | null;
  if (!e || e.code !== "SQLITE_CONSTRAINT_UNIQUE" || typeof e.message !== "string") return null;
  const columns = /UNIQUE constraint failed: (.+)$/.exec(e.message)?.[1]?.split(",").map((c) => c.trim()) ?? [];
  const known = columns.map((c) => UNIQUE_FIELDS[c]).find(Boolean);
  if (known) return new ApiError("conflict", known.message, { fields: { [known.field]: [known.message] } });
  const field = columns[0]?.split(".").pop()?.replace(/_([a-z])/g, (_, c: string) => c.toUpperCase()) ?? "_";
  const message = `That ${field} is already used by another record; choose another.`;
  return new ApiError("conflict", message, { fields: { [field]: [message] } });
}
