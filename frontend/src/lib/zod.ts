import { config } from 'zod/v4/core';

/*
 * The forms' schema library: zod's tree-shakable functional API (zod/mini), set up once here rather
 * than in main.tsx, so that only the routes with a form load zod at all.
 *
 * The server's Content-Security-Policy allows no eval (docs/security.md); without `jitless` zod would
 * try `new Function` once to see whether it may compile its parsers, and the browser reports a violation.
 */
config({ jitless: true });

export * as z from 'zod/mini';
