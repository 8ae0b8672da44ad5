import { config } from 'zod';

// zod compiles object parsers with `new Function` when it may; the Content-Security-Policy forbids
// that in the browser, and zod's probe for it would be reported as a violation. Parse without it.
config({ jitless: true });
