// Runs before the app's modules: zod decides while its schemas are being defined whether to compile
// fast parsers with `new Function`, and its probe for that is reported as a violation of the page's
// content security policy (no eval). Setting its global config first keeps it from probing.
globalThis.__zod_globalConfig = Object.assign(globalThis.__zod_globalConfig || {}, { jitless: true });
