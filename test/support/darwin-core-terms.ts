/** Darwin Core term names: TDWG Darwin Core terms list (CC BY 4.0), copied to test/fixtures. */
import { readFileSync } from 'node:fs';

export const DARWIN_CORE_TERMS: ReadonlySet<string> = new Set(
  readFileSync(new URL('../fixtures/darwin-core-terms.txt', import.meta.url), 'utf8')
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l && !l.startsWith('#')),
);
