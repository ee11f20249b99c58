/**
 * The `import` and `gazetteer` verbs registered on a real commander program, against a real SQLite
 * file, with the fixture gazetteers (invented places).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Command } from 'commander';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { registerGazetteer } from '../../src/cli/commands/gazetteer.ts';
import { registerImport } from '../../src/cli/commands/import.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';

const FIXTURES = new URL('../fixtures/gazetteer/', import.meta.url).pathname;
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-cli-'));
const db = join(directory, 'cli.sqlite');
afterAll(() => rmSync(directory, { recursive: true, force: true }));

/** Runs one command line and returns what it printed on stdout. */
async function run(...args: string[]): Promise<string> {
  const program = new Command('whereabouts').exitOverride();
  registerImport(program, () => db);
  registerGazetteer(program, () => db);
  const printed: string[] = [];
  const spy = vi.spyOn(process.stdout, 'write').mockImplementation((chunk) => {
    printed.push(String(chunk));
    return true;
  });
  try {
    await program.parseAsync(args, { from: 'user' });
  } finally {
    spy.mockRestore();
  }
  return printed.join('');
}

describe('whereabouts import and gazetteer', () => {
  it('imports with the format taken from the extension and prints a summary with the refused rows', async () => {
    const out = await run('import', join(FIXTURES, 'malformed-dump.txt'), '--source', 'Fixture dump', '--source-id', 'dump', '--licence', 'CC0-1.0');
    expect(out).toMatch(/^source dump: 8 rows read, 3 imported, 5 rejected, \d+\.\d s\n/);
    expect(out).toContain('  row 3: latitude 95 is outside −90…90\n');
    await run('import', join(FIXTURES, 'admin.geojson'));
  });

  it('takes default radii for this source from --default-radius', async () => {
    await run('import', join(FIXTURES, 'places.csv'), '--default-radius', 'town=7000', '--default-radius', 'village=2500');
    const store = openGazetteer(db, { readonly: true });
    expect(store.getFeature('places', 'p1')).toMatchObject({ featureType: 'town', radiusMeters: 7000, radiusIsDefault: true });
    expect(store.getFeature('places', 'p3')).toMatchObject({ featureType: 'village', radiusMeters: 2500 });
    expect(store.getFeature('places', 'p2')).toMatchObject({ radiusMeters: 1500, radiusIsDefault: false });
    store.close();
    await run('gazetteer', 'remove', 'places');
    await expect(run('import', join(FIXTURES, 'places.csv'), '--default-radius', 'town')).rejects.toThrow('--default-radius needs type=meters');
  });

  it('lists the sources with citation, licence and hash, and removes one', async () => {
    const listed = await run('gazetteer', 'list');
    expect(listed).toMatch(/^admin\t5 features\timported \S+\tsha256 [0-9a-f]{64}\n  citation: admin\.geojson \(1,265 bytes, sha256 [0-9a-f]{12}, imported \d{4}-\d\d-\d\d; no citation given\)\n  licence: not recorded\n/);
    expect(listed).not.toContain(FIXTURES); // never the importer's folder
    expect(listed).toContain('dump\t3 features');
    expect(listed).toContain('  citation: Fixture dump\n  licence: CC0-1.0\n');
    expect(await run('gazetteer', 'remove', 'dump')).toBe('removed source dump\n');
    expect(JSON.parse(await run('gazetteer', 'list', '--json')).map((s: { id: string }) => s.id)).toEqual(['admin']);
  });

  it('says what is wrong with a bad command line', async () => {
    await expect(run('gazetteer', 'remove', 'nothing')).rejects.toThrow("no gazetteer source 'nothing'");
    await expect(run('import', join(directory, 'places.xyz'))).rejects.toThrow('cannot tell the format of');
    await expect(run('import', join(FIXTURES, 'places.csv'), '--format', 'xml')).rejects.toThrow("--format must be one of csv, geojson, geonames, shapefile, gpkg, not 'xml'");
  });
});
