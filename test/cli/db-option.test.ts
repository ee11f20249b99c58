import { describe, expect, it } from 'vitest';
import { DEFAULT_DB, takeDbOption } from '../../src/cli/db-option.ts';

// The CLI contract (issue 2): `--db <file>` before or after the verb; env WHEREABOUTS_DB; default file.
describe('--db option', () => {
  it('is taken before the verb', () => {
    expect(takeDbOption(['--db', 'a.sqlite', 'locate', 'X'], {})).toEqual({ dbPath: 'a.sqlite', rest: ['locate', 'X'] });
  });
  it('is taken after the verb, also as --db=file', () => {
    expect(takeDbOption(['locate', 'X', '--db=b.sqlite', '--json'], {})).toEqual({ dbPath: 'b.sqlite', rest: ['locate', 'X', '--json'] });
  });
  it('falls back to WHEREABOUTS_DB, then the default', () => {
    expect(takeDbOption(['locate', 'X'], { WHEREABOUTS_DB: 'env.sqlite' }).dbPath).toBe('env.sqlite');
    expect(takeDbOption(['locate', 'X'], {}).dbPath).toBe(DEFAULT_DB);
  });
  it('leaves a locality text that merely contains --db alone after --', () => {
    expect(takeDbOption(['locate', '--', '--db'], {}).rest).toEqual(['locate', '--', '--db']);
  });
  it('says so when the file name is missing', () => {
    expect(() => takeDbOption(['locate', 'X', '--db'], {})).toThrow(/--db needs a file name/);
  });
});
