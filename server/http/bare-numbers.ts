// JSON has no NaN or Infinity, but a hand-written client or a form that printed a JavaScript number can send
// them bare. Quoting them turns the body into JSON the schema can judge, so the answer names the field that
// carried one instead of saying only "not valid JSON". Text inside strings is left alone.
const BARE = /^(?:NaN|-?Infinity)/;

export function quoteBareNonFiniteNumbers(text: string): string | null {
  let out = "";
  let changed = false;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (inString) {
      out += ch;
      if (ch === "\\") out += text[++i] ?? "";
      else if (ch === '"') inString = false;
      continue;
    }
    if (ch === '"') {
      inString = true;
      out += ch;
      continue;
    }
    const bare = BARE.exec(text.slice(i, i + 9));
    if (bare) {
      out += JSON.stringify(bare[0]);
      i += bare[0].length - 1;
      changed = true;
      continue;
    }
    out += ch;
  }
  return changed ? out : null;
}
