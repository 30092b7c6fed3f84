import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const root = fileURLToPath(new URL("../../..", import.meta.url));

/**
 * Loads zod in a fresh Node process, as a page's script does: optionally after
 * instrumentation-client.ts, then builds and parses an object schema. `Function` is wrapped so
 * every `new Function` (what a Content-Security-Policy without 'unsafe-eval' refuses and reports)
 * is counted.
 */
function loadZod(afterInstrumentation: boolean) {
  const script = `
    let built = 0;
    globalThis.Function = new Proxy(globalThis.Function, { construct(target, args) { built++; return Reflect.construct(target, args); } });
    if (${afterInstrumentation}) await import(${JSON.stringify(`${root}instrumentation-client.ts`)});
    const { z } = await import("zod");
    const parsed = z.object({ unit: z.string() }).parse({ unit: "T-12" });
    console.log(JSON.stringify({ built, jitless: z.config().jitless === true, parsed }));
  `;
  const run = spawnSync(process.execPath, ["--import", "tsx", "--input-type=module", "-e", script], { cwd: root, encoding: "utf8" });
  expect(run.stderr).toBe("");
  return JSON.parse(run.stdout) as { built: number; jitless: boolean; parsed: { unit: string } };
}

describe("zod in the browser", () => {
  it("builds no parser with eval when it loads after instrumentation-client", () => {
    const seen = loadZod(true);
    expect(seen).toEqual({ built: 0, jitless: true, parsed: { unit: "T-12" } });
  });

  it("would reach for eval without it (so the first check can tell the two apart)", () => {
    const seen = loadZod(false);
    expect(seen.jitless).toBe(false);
    expect(seen.built).toBeGreaterThan(0);
  });
});
