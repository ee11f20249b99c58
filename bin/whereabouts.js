#!/usr/bin/env node
// Runs the compiled CLI in dist/, which `npm ci` builds (the `prepare` script) and every test run
// rebuilds (test/support/build.ts). A checkout without dist/ runs the TypeScript sources through tsx,
// as does WHEREABOUTS_FROM_SOURCE=1; that costs about 1.5 s of compiling a start.
import { existsSync } from 'node:fs';

const compiled = new URL('../dist/cli/main.js', import.meta.url);
if (existsSync(compiled) && !process.env.WHEREABOUTS_FROM_SOURCE) {
  await import(compiled.href);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  await import('../src/cli/main.ts');
}
