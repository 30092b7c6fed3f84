/** Money is integer cents everywhere; one function writes it for people (123456 → "$1,234.56") on every screen, e-mail and PDF. */
export { formatCents } from "@/server/money/totals";

/**
 * "125.50" or "$1,234" typed by a person → cents, exactly (no float arithmetic); undefined for an
 * empty box, the text itself when it is not an amount, so the server's schema names the field.
 */
export function parseDollars(text: string): number | undefined | string {
  const s = text.trim().replace(/^\$/, "").replace(/,/g, "");
  if (s === "") return undefined;
  const m = /^(\d{1,9})(?:\.(\d{1,2}))?$/.exec(s);
  if (!m) return text;
  return Number(m[1]) * 100 + Number((m[2] ?? "0").padEnd(2, "0"));
}
