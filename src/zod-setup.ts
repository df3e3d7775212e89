import { config } from 'zod/v4/core';

// No code generation in the browser: zod would otherwise probe for `new Function` on its first
// object parse, which the content-security policy (`script-src 'self'`) blocks and reports.
// (The core's `config` alone, so that the initial bundle does not take in the whole library.)
config({ jitless: true });
