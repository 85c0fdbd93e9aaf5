import { z } from 'zod';

// zod 4 compiles object parsers with `new Function` where it can, and probes for it first; under
// our Content-Security-Policy (no 'unsafe-eval') the probe is a violation the browser reports.
// In the browser zod runs without compiling: the same answers, and nothing blocked.
z.config({ jitless: true });
