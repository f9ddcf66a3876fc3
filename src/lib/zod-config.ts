import { z } from 'zod';

// zod compiles fast object parsers with `new Function` after probing whether eval is allowed; our
// Content-Security-Policy forbids eval, and the probe alone makes the browser report a violation.
z.config({ jitless: true });
