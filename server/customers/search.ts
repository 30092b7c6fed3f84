import "server-only";
import { type Expression, type SqlBool, sql } from "kysely";
import type { z } from "zod";
import { validationError } from "@/server/http/errors";

/** `column LIKE '%q%'` with the user's own % and _ taken literally. SQLite's LIKE ignores ASCII case. */
export function containsText(column: Expression<string>, q: string): Expression<SqlBool> {
  const pattern = `%${q.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`;
  return sql<SqlBool>`${column} like ${pattern} escape '\\'`;
}

/** A list route's query string through its schema; empty parameters count as not given. */
export function readQuery<S extends z.ZodType>(req: Request, schema: S): z.infer<S> {
  const given = [...new URL(req.url).searchParams.entries()].filter(([, v]) => v !== "");
  const parsed = schema.safeParse(Object.fromEntries(given));
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}
