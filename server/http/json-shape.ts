/**
 * Checks on a JSON text before it reaches code we do not own (the upload SDK): nesting no deeper
 * than a real request needs, and no string with half of a UTF-16 pair (it cannot be encoded into a
 * URL or a file name). Returns what to fix, or null when the text is fine.
 */
export function jsonShapeProblem(text: string, maxDepth = 32): string | null {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (inString) {
      if (ch === "\\") i++;
      else if (ch === '"') inString = false;
    } else if (ch === '"') inString = true;
    else if (ch === "[" || ch === "{") {
      if (++depth > maxDepth) return `The request is nested too deeply (at most ${maxDepth} levels).`;
    } else if (ch === "]" || ch === "}") depth--;
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    return "The request body is not valid JSON.";
  }
  return hasBrokenText(value) ? "A name or text in the request has a broken character; rename the file and try again." : null;
}

/** Half of a UTF-16 pair: a high surrogate not followed by a low one, or a low one on its own. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const wellFormed = (s: string) => !LONE_SURROGATE.test(s);

function hasBrokenText(value: unknown): boolean {
  if (typeof value === "string") return !wellFormed(value);
  if (Array.isArray(value)) return value.some(hasBrokenText);
  if (value && typeof value === "object") return Object.entries(value).some(([k, v]) => !wellFormed(k) || hasBrokenText(v));
  return false;
}
