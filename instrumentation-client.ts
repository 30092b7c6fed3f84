import type { $ZodConfig } from "zod/v4/core";

// Runs in the browser before the app's code. zod compiles fast parsers with `new Function` when it
// can; the page's Content-Security-Policy forbids eval, so it parses without them (the forms'
// schemas are small; nobody notices the difference).
//
// zod keeps its settings on `globalThis.__zod_globalConfig` and takes one written there before it
// loads. Setting it here rather than through `z.config` keeps zod out of the scripts every page
// loads: only the pages that parse in the browser (the calculator, a job's kit spec) fetch it.
const shared = globalThis as { __zod_globalConfig?: $ZodConfig };
shared.__zod_globalConfig ??= {};
shared.__zod_globalConfig.jitless = true;
