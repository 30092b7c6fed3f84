import { z } from "zod";

// Runs in the browser before the app's code. zod compiles fast parsers with `new Function` when it
// can; the page's Content-Security-Policy forbids eval, so it parses without them (the forms'
// schemas are small; nobody notices the difference).
z.config({ jitless: true });
