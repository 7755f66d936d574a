// Runs in the browser before the app's own code (Next.js instrumentation-client). zod 4 compiles
// object schemas with `new Function` when it may, and finds out by trying one: under our CSP
// (script-src without 'unsafe-eval', next.config.mjs) that try is refused and reported as a CSP
// violation on every page with a form. jitless skips the try; parsing is the same, just not
// compiled. Set before any schema is built (zod reads it when a z.object is constructed).
// tests/e2e/security.spec.ts fails on any CSP violation.
import { z } from "zod";

z.config({ jitless: true });
