import { config } from 'zod/v4/core';

// Runs in the browser before any of the app's own code. zod compiles its object parsers with
// `new Function` where it may, and its probe for that throws under the Content-Security-Policy
// (no 'unsafe-eval', proxy.ts). zod catches the throw and parses without, but the browser still
// reports a policy violation on every page that parses; told up front, zod does not probe. The
// server has no such policy and keeps the compiled parsers.
config({ jitless: true });
