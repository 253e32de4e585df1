import { z } from 'zod';

// Zod probes `new Function` once to decide whether to compile its parsers. The CSP has no
// 'unsafe-eval', so the browser refuses the probe and reports a policy violation, although zod
// carries on without compiling. Import this module first in any island that parses with zod.
z.config({ jitless: true });
