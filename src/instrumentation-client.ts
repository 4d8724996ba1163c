/**
 * Runs in the browser before any of the app's modules (Next.js loads this file first on every page).
 *
 * Zod compiles its object parsers with `new Function` where it may, and finds out by trying once, when
 * the first object schema is made. The content security policy (no 'unsafe-eval') refuses that try, and
 * the browser reports a policy violation on every page with a form, though zod then parses without
 * compiling. Zod's `jitless` option (what `z.config({ jitless: true })` sets) skips the try. It is set
 * here in the global object zod reads its configuration from, rather than by importing zod, which
 * would put zod into the first-load script of every page. e2e/content-security.spec.ts fails if the
 * violation comes back, e.g. should zod move its configuration.
 */
type ZodGlobalConfig = { jitless?: boolean };
const holder = globalThis as typeof globalThis & { __zod_globalConfig?: ZodGlobalConfig };
holder.__zod_globalConfig ??= {};
holder.__zod_globalConfig.jitless = true;
