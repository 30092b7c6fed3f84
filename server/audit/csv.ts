/**
 * CSV for spreadsheets. A cell that starts with = + - @ or a tab or carriage return would run as
 * a formula when the file is opened (CSV injection, OWASP's "CSV Injection" page), and a staff
 * name, a typed e-mail or an override reason is text anyone could have chosen: such cells get a
 * leading apostrophe, which spreadsheets show as text.
 *
 * A plain number is the one exception: "-1993.70" (a job under its quote) or "-2" holds no formula,
 * so it is written as it is and stays a number the spreadsheet can add up. Only an optional minus,
 * digits and at most one decimal point count; "-1+2", "-2e3", "- 5" or "-40 gal tank" are still
 * made text.
 */
const PLAIN_NUMBER = /^-?(?:\d+(?:\.\d+)?|\.\d+)$/;

export function csvCell(value: string | number | null | undefined): string {
  let text = value === null || value === undefined ? "" : String(value);
  if (/^[=+\-@\t\r]/.test(text) && !PLAIN_NUMBER.test(text)) text = `'${text}`;
  // RFC 4180: quote a field holding a comma, quote or line break, doubling its quotes.
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

export function toCsv(header: string[], rows: (string | number | null | undefined)[][]): string {
  return [header, ...rows].map((row) => row.map(csvCell).join(",")).join("\r\n") + "\r\n";
}
