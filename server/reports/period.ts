import { z } from "zod";
import { calendarDate, isCalendarDate } from "@/server/http/calendar-date";
import { addCalendarDays } from "@/server/shop/business-days";
import type { Period } from "./compute";

/** Reports cover at most two years at a time; a longer span is refused with what to do. */
export const MAX_PERIOD_DAYS = 731;
export const DEFAULT_PERIOD_DAYS = 90;

const periodSchema = z
  .object({ from: calendarDate("the first day").optional(), to: calendarDate("the last day").optional() })
  .refine((p) => !p.from || !p.to || p.from <= p.to, { error: "The first day must be on or before the last day.", path: ["from"] })
  .refine((p) => !isCalendarDate(p.from) || !isCalendarDate(p.to) || addCalendarDays(p.from, MAX_PERIOD_DAYS - 1) >= p.to, {
    error: `A report covers at most ${MAX_PERIOD_DAYS} days: choose a later first day or an earlier last day.`,
    path: ["from"],
  });

/**
 * The period of a report from `?from=&to=` (YYYY-MM-DD, the shop's calendar). With neither, the
 * last 90 days to today; with one, 90 days from or to it.
 */
export function readPeriod(search: URLSearchParams | Record<string, string | undefined>, today: string) {
  const get = (k: string) => (search instanceof URLSearchParams ? (search.get(k) ?? undefined) : search[k]) || undefined;
  const raw = { from: get("from"), to: get("to") };
  const parsed = periodSchema.safeParse(raw);
  if (!parsed.success) return { ok: false as const, error: parsed.error };
  const { from, to } = parsed.data;
  const period: Period = {
    from: from ?? addCalendarDays(to ?? today, -(DEFAULT_PERIOD_DAYS - 1)),
    to: to ?? (from ? addCalendarDays(from, DEFAULT_PERIOD_DAYS - 1) : today),
  };
  return { ok: true as const, period };
}
