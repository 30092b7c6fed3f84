/** Money is integer cents everywhere; this only writes it for people: 123456 → "$1,234.56". */
export function formatCents(cents: number): string {
  const sign = cents < 0 ? "−" : "";
  const abs = Math.abs(Math.trunc(cents));
  const dollars = Math.floor(abs / 100).toLocaleString("en-US");
  return `${sign}$${dollars}.${String(abs % 100).padStart(2, "0")}`;
}

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
