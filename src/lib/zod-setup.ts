// Imported first by main.tsx, before any schema is defined: zod decides at definition time whether
// to compile fast parsers with `new Function`, and its probe for that trips the page's content
// security policy (no eval), leaving an error in the console. Parse without it.
import { z } from 'zod';

z.config({ jitless: true });
