import { z } from 'zod';

// No code generation in the browser: zod would otherwise probe for `new Function` on its first
// object parse, which the content-security policy (`script-src 'self'`) blocks and reports.
z.config({ jitless: true });
