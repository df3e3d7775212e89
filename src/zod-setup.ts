// No code generation in the browser: the schema library (zod 4) would otherwise probe for
// `new Function` on its first object parse, which the content-security policy (`script-src 'self'`)
// blocks and reports. zod reads its settings from this global when its core module first loads, so
// setting it here (the first import of main.ts) equals `z.config({ jitless: true })` without pulling
// the library into the initial bundle.
const settings = globalThis as { __zod_globalConfig?: { jitless?: boolean } };
settings.__zod_globalConfig = { ...settings.__zod_globalConfig, jitless: true };

export {};
