import { z } from 'zod';

/*
 * Runs in the browser before the app's own modules. The Content-Security-Policy allows no eval
 * (lib/auth/security-headers.ts); zod would probe for it with `new Function` as soon as the first
 * object schema is built (the contracts the pages import), and the browser reports the probe as a
 * violation even though zod catches it. Its compiled parsers are only a speed-up, so the browser
 * parses without them.
 */
z.config({ jitless: true });
