/** Field errors as the API sends them: dotted paths such as "seams.2.result" to their messages. */
export type FieldErrors = Record<string, string[]>;

/** "1", "1 and 2", "1, 2 and 4"; three or more in a row become a range: "1–3 and 5". */
export function listNumbers(numbers: readonly number[]): string {
  const sorted = [...new Set(numbers)].sort((a, b) => a - b);
  const parts: string[] = [];
  for (let i = 0; i < sorted.length; ) {
    let j = i;
    while (j + 1 < sorted.length && sorted[j + 1] === sorted[j] + 1) j++;
    if (j - i >= 2) parts.push(`${sorted[i]}–${sorted[j]}`);
    else for (let k = i; k <= j; k++) parts.push(String(sorted[k]));
    i = j + 1;
  }
  return parts.length <= 1 ? (parts[0] ?? "") : `${parts.slice(0, -1).join(", ")} and ${parts[parts.length - 1]}`;
}

/**
 * Errors on a list's items ("inspection.dftReadingsMils.0", ".1", …) with each distinct message
 * shown once, naming the items it is about: "Readings 1–3 (64, 71, 76): …". Errors on the list as
 * a whole come first, as they are.
 */
export function collapseListErrors(
  fields: FieldErrors,
  path: string,
  noun: { one: string; many: string },
  valueOf?: (index: number) => string | undefined,
): string[] {
  const whole = fields[path] ?? [];
  const byMessage = new Map<string, number[]>();
  for (const [key, messages] of Object.entries(fields)) {
    if (!key.startsWith(`${path}.`)) continue;
    const index = Number(key.slice(path.length + 1));
    if (!Number.isInteger(index)) continue;
    for (const message of messages) byMessage.set(message, [...(byMessage.get(message) ?? []), index]);
  }
  const items = [...byMessage.entries()].map(([message, indexes]) => {
    const values = valueOf ? indexes.map(valueOf).filter((v): v is string => v !== undefined && v !== "") : [];
    const named = `${indexes.length === 1 ? noun.one : noun.many} ${listNumbers(indexes.map((i) => i + 1))}`;
    return `${named}${values.length ? ` (${values.join(", ")})` : ""}: ${message}`;
  });
  return [...new Set(whole), ...items];
}

// "Result of seam 1", "Result of seam 2", "Result of seam 3" → "Result of seams 1–3", kept where the first one stood.
function groupNumbered(names: string[]): string[] {
  const groups = new Map<string, number[]>();
  const out: string[] = [];
  for (const name of names) {
    const numbered = /^(.*\S) (\d+)$/.exec(name);
    if (!numbered) {
      out.push(name);
      continue;
    }
    const [, stem, n] = numbered;
    if (!groups.has(stem)) {
      groups.set(stem, []);
      out.push(`\u0000${stem}`);
    }
    groups.get(stem)!.push(Number(n));
  }
  return out.map((name) => {
    if (!name.startsWith("\u0000")) return name;
    const stem = name.slice(1);
    const numbers = groups.get(stem)!;
    return numbers.length === 1 ? `${stem} ${numbers[0]}` : `${stem}s ${listNumbers(numbers)}`;
  });
}

/**
 * What a refused form says in one line: the names of the entries to fix, in the form's order, each
 * once; numbered ones ending in the same words are named together ("Result of seams 1–3"). A field
 * the form does not show (`label` gives null) is told by its message instead.
 */
export function fieldErrorSummary(fields: FieldErrors, order: readonly string[], label: (key: string) => string | null): string {
  const rank = (key: string) => {
    const at = order.findIndex((name) => key === name || key.startsWith(`${name}.`));
    const index = Number(/\.(\d+)(\.|$)/.exec(key)?.[1] ?? 0);
    return [at < 0 ? order.length : at, index] as const;
  };
  const keys = Object.keys(fields).sort((a, b) => {
    const [ra, ia] = rank(a);
    const [rb, ib] = rank(b);
    return ra - rb || ia - ib;
  });
  const names = groupNumbered([...new Set(keys.map(label).filter((name): name is string => name !== null))]);
  const unshown = [...new Set(keys.filter((key) => label(key) === null).flatMap((key) => fields[key]))];
  const parts: string[] = [];
  if (names.length) parts.push(`Fix ${names.length === 1 ? "1 entry" : `${names.length} entries`}: ${names.join(", ")}.`);
  parts.push(...unshown);
  return parts.join(" ");
}
