import { readFileSync, readdirSync, statSync } from "node:fs";
import { join, relative, sep } from "node:path";

/** What the app serves, found by walking `app/`: every route handler method, page and server action. */
export interface AppEntry {
  /** The key the access matrix lists: "GET /api/jobs/[id]", "PAGE /jobs/[id]", "ACTION app/(auth)/first-run/actions.ts#createOwnerAction". */
  key: string;
  kind: "route" | "page" | "action";
  /** The file, relative to the project. */
  file: string;
  /** The URL pattern with route groups removed ("/api/jobs/[id]"); for actions, the page folder's pattern. */
  path: string;
  method?: string;
  exportName?: string;
}

export const APP_DIR = join(process.cwd(), "app");
const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"];

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? walk(path) : [path];
  });
}

/** "/(shop)/jobs/[id]" → "/jobs/[id]": route groups do not appear in the URL. */
export function urlPattern(folder: string): string {
  const parts = folder.split(sep).filter((p) => p && !/^\(.*\)$/.test(p) && !p.startsWith("@"));
  return "/" + parts.join("/");
}

function exportedNames(source: string): string[] {
  const names = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:async\s+)?function\s+([A-Za-z0-9_$]+)/g)) names.add(m[1]);
  for (const m of source.matchAll(/export\s+const\s+([A-Za-z0-9_$]+)\s*=/g)) names.add(m[1]);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(",")) {
      const name = part.trim().split(/\s+as\s+/).pop()?.trim();
      if (name) names.add(name);
    }
  }
  return [...names];
}

/** True when the file's first statement is the "use server" directive. */
export function isServerActionFile(source: string): boolean {
  const body = source.replace(/^(\s|\/\/[^\n]*\n|\/\*[\s\S]*?\*\/)*/, "");
  return /^["']use server["']/.test(body);
}

export function appEntries(): AppEntry[] {
  const out: AppEntry[] = [];
  for (const abs of walk(APP_DIR)) {
    const file = relative(process.cwd(), abs);
    const rel = relative(APP_DIR, abs);
    const folder = rel.split(sep).slice(0, -1).join(sep);
    const base = rel.split(sep).pop() ?? "";
    if (!/\.(ts|tsx|js|jsx|mjs)$/.test(base)) continue;
    const source = readFileSync(abs, "utf8");
    const path = urlPattern(folder);
    if (/^route\.(ts|js|mjs)$/.test(base)) {
      for (const name of exportedNames(source)) {
        if (METHODS.includes(name)) out.push({ key: `${name} ${path}`, kind: "route", file, path, method: name, exportName: name });
      }
    } else if (/^page\.(tsx|ts|jsx|js)$/.test(base)) {
      out.push({ key: `PAGE ${path}`, kind: "page", file, path });
    } else if (isServerActionFile(source)) {
      for (const name of exportedNames(source)) out.push({ key: `ACTION ${file}#${name}`, kind: "action", file, path, exportName: name });
    }
  }
  return out.sort((a, b) => a.key.localeCompare(b.key));
}

/** Files that use "use server" somewhere other than their first line (an inline action the matrix cannot list). */
export function inlineServerActions(): string[] {
  return walk(APP_DIR)
    .filter((abs) => /\.(ts|tsx)$/.test(abs))
    .filter((abs) => {
      const source = readFileSync(abs, "utf8");
      return !isServerActionFile(source) && /^\s*["']use server["'];?\s*$/m.test(source);
    })
    .map((abs) => relative(process.cwd(), abs));
}
