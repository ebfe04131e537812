/**
 * zod's fast path compiles validators with `new Function`, which the app's content security policy
 * (script-src 'self', no eval) forbids. Turning it off before any schema is used keeps the policy
 * strict; zod's interpreter gives the same results.
 */
import { z } from 'zod';

z.config({ jitless: true });
