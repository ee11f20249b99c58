/**
 * Sensitive localities generalised on request, through the real CLI batch with the demo gazetteer: rows of
 * the listed taxa (or marked by a column) get the centre of their grid cell, a radius grown to cover the
 * cell, dataGeneralizations and informationWithheld; their precise georeference is nowhere in the output
 * and is in the job database; every other row is byte for byte as in a run without the option.
 * The reference for the cell and radius is independent of the code under test: the cell from the grid
 * lines (Chapman 2020, doi:10.15468/doc-5jp4-5g10, grid generalisation; from memory) and Vincenty's
 * distances on WGS84 from the registry package geodesy 2.4.0 (C. Veness, MIT).
 */
import { execFile } from 'node:child_process';
import { createWriteStream, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { promisify } from 'node:util';
import Database from 'better-sqlite3';
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { beforeAll, describe, expect, it } from 'vitest';
import yazl from 'yazl';
import { unzip } from '../batch/helpers.ts';
import { holdsCoordinate, withheldRows } from '../support/withheld.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-sensitive-'));
const db = join(dir, 'demo.sqlite');
const RUN_AT = '2026-05-01T09:30:00Z';
const LINE_END = '\r\n';

function whereabouts(...args: string[]) {
  return run(process.execPath, [cli, '--db', db, ...args], { cwd: root, maxBuffer: 64 << 20 });
}

async function batch(input: string, name: string, ...options: string[]): Promise<string> {
  const out = join(dir, name);
  await whereabouts('batch', input, '--out', out, '--quiet', '--run-timestamp', RUN_AT, ...options);
  return readFileSync(out, 'utf8');
}

const rowsOf = (text: string) => parse(text) as string[][];
/** Lines of the output (the demo file has no line breaks inside fields). */
const linesOf = (text: string) => text.split(LINE_END).filter(Boolean);
const vincenty = (a: [number, number], b: [number, number]) => new LatLon(a[0], a[1]).distanceTo(new LatLon(b[0], b[1]));

/** The expected generalisation of a precise point-radius, computed here without the code under test. */
function expectedCell(lat: number, lon: number, radius: number, grid: number, decimals: number) {
  const south = Math.floor(lat / grid) * grid;
  const west = Math.floor(lon / grid) * grid;
  const centre: [number, number] = [south + grid / 2, west + grid / 2];
  const corners: [number, number][] = [[south, west], [south, west + grid], [south + grid, west], [south + grid, west + grid]];
  const farthest = Math.max(...corners.map((c) => vincenty(centre, c)));
  return { latitude: centre[0].toFixed(decimals), longitude: centre[1].toFixed(decimals), radius: Math.ceil(farthest + radius) };
}

const input = join(dir, 'localities.csv');
/** Only the rows of the listed taxa: any precise coordinate in an output of it is a leak, not another record's own. */
const listedOnly = join(dir, 'listed-only.csv');
const marked = join(dir, 'marked.csv');
const taxa = join(dir, 'taxa.csv');
let plain: string;

beforeAll(async () => {
  await whereabouts('import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
  const source = readFileSync(join(root, 'gazetteer/demo-localities.csv'), 'utf8');
  writeFileSync(input, source);
  // The holder's list: two taxa, spelled with other case and spacing than the records (matched after folding).
  writeFileSync(taxa, 'scientificName,gridDegrees\n"  verdemaria   LINDOENSIS",0.1\nSerenella alticola,0.01\n');
  // A marking column built here: every row of Aubracia marina marked "yes".
  const rows = rowsOf(source);
  writeFileSync(marked, stringify(rows.map((r, i) => [...r, i === 0 ? 'withhold' : r[2] === 'Aubracia marina' ? 'yes' : ''])));
  writeFileSync(listedOnly, stringify(rows.filter((r, i) => i === 0 || r[2] === 'Verdemaria lindoensis' || r[2] === 'Serenella alticola')));
  plain = await batch(input, 'plain.csv');
}, 180_000);

describe('batch --sensitive-taxa', () => {
  it('generalises the listed taxa, keeps the precise georeference only in the job store, and leaves every other row as it was', async () => {
    const out = await batch(input, 'generalised.csv', '--sensitive-taxa', taxa);
    const plainRows = rowsOf(plain);
    const outRows = rowsOf(out);
    const header = plainRows[0];
    const col = (name: string) => header.indexOf(name);
    // A term the demo input has already (decimalLatitude …) is appended as proposed_<term>.
    const term = (t: string) => (col(`proposed_${t}`) >= 0 ? col(`proposed_${t}`) : col(t));
    const [latAt, lonAt, radiusAt, footprintAt] = ['decimalLatitude', 'decimalLongitude', 'coordinateUncertaintyInMeters', 'footprintWKT'].map(term);
    const inputColumns = col('proposed_decimalLatitude');
    // The two Darwin Core terms (TDWG dwc terms list) come just before the flags column, only on request.
    expect(outRows[0]).toEqual([...header.slice(0, -1), 'dataGeneralizations', 'informationWithheld', header.at(-1)]);
    expect(plain).not.toContain('dataGeneralizations');

    const plainLines = linesOf(plain);
    const outLines = linesOf(out);
    expect(outLines).toHaveLength(plainLines.length);
    const grids: Record<string, number> = { 'Verdemaria lindoensis': 0.1, 'Serenella alticola': 0.01 };
    const jobs = new Database(`${db.replace(/\.sqlite$/, '')}.jobs.sqlite`, { readonly: true });
    const withheld = new Map((jobs.prepare('SELECT row_number, precise FROM batch_withheld').all() as { row_number: number; precise: string }[]).map((r) => [r.row_number, JSON.parse(r.precise) as Record<string, string>]));
    jobs.close();
    let generalised = 0;
    const preciseOfGeneralised: string[] = [];
    for (let i = 1; i < plainRows.length; i++) {
      const before = plainRows[i];
      const after = outRows[i];
      const grid = grids[before[col('scientificName')]];
      if (grid === undefined) {
        // Unchanged byte for byte but for the two empty terms before the flags field.
        const flags = stringify([[before.at(-1)!]], { eof: false });
        expect(outLines[i], `row ${i}`).toBe(`${plainLines[i].slice(0, plainLines[i].length - flags.length)},,${flags}`);
        continue;
      }
      const lat = before[latAt];
      if (lat === '') {
        expect(after.slice(-3, -1), `row ${i}`).toEqual(['', '']); // nothing to generalise
        continue;
      }
      generalised++;
      const lon = before[lonAt];
      const radius = Number(before[radiusAt]);
      // Original columns untouched (the holder's own, never changed: see the README).
      expect(after.slice(0, inputColumns)).toEqual(before.slice(0, inputColumns));
      const expected = expectedCell(Number(lat), Number(lon), radius, grid, grid === 0.1 ? 2 : 3);
      expect(after[latAt]).toBe(expected.latitude);
      expect(after[lonAt]).toBe(expected.longitude);
      expect(Number(after[radiusAt])).toBe(expected.radius);
      expect(after[footprintAt]).toMatch(/^POLYGON\(\(/);
      // Darwin Core's own example wording ("Coordinates generalized from original GPS coordinates to the nearest half degree grid cell"; from memory).
      expect(after.at(-3)).toBe(`Coordinates generalized from the original georeference to the centre of a ${grid}° cell of the latitude-longitude grid; coordinateUncertaintyInMeters grown to cover the cell and the original uncertainty; footprintWKT is the cell`);
      expect(after.at(-2)).toMatch(/^Precise location information withheld under the holder's policy \(decimalLatitude, .*\); available from the data custodian$/);
      // The precise georeference: in the job store, not in this row.
      expect(withheld.get(i), `row ${i}`).toMatchObject({ decimalLatitude: lat, decimalLongitude: lon, coordinateUncertaintyInMeters: String(radius), footprintWKT: before[footprintAt] });
      // Nothing appended to the row holds the precise point (its own columns are the holder's, kept as they came).
      const appended = after.slice(inputColumns).join('\n');
      expect(appended).not.toContain(lat);
      expect(appended).not.toContain(lon);
      expect(appended).not.toContain(before[footprintAt]);
      if (!before.slice(0, inputColumns).join('\n').includes(lat)) preciseOfGeneralised.push(lat, lon);
    }
    expect(generalised).toBeGreaterThanOrEqual(8);
    expect(withheld.size).toBe(generalised);
    // No precise coordinate of a generalised row anywhere in the file, but where an unlisted row has the same one.
    const elsewhere = outRows.slice(1).filter((r) => grids[r[col('scientificName')]] === undefined).flat().join('\n');
    for (const value of preciseOfGeneralised) if (!elsewhere.includes(value)) expect(out).not.toContain(value);
  }, 180_000);
});

describe('batch --sensitive-taxa --format geojson', () => {
  it('puts the generalised rows at their cell centres (the GeoJSON is made from the generalised CSV)', async () => {
    const geojson = JSON.parse(await batch(input, 'generalised.geojson', '--sensitive-taxa', taxa, '--format', 'geojson')) as { features: { geometry: { coordinates: number[] } | null; properties: Record<string, string> }[] };
    const listed = geojson.features.filter((f) => f.properties.scientificName === 'Verdemaria lindoensis' && f.geometry);
    expect(listed.length).toBeGreaterThan(0);
    for (const f of listed) {
      // GeoJSON positions are longitude, latitude (RFC 7946 §3.1.1): the centre of a 0.1° cell.
      expect(f.geometry!.coordinates.map((c) => c.toFixed(2))).toEqual([f.properties.proposed_decimalLongitude, f.properties.proposed_decimalLatitude]);
      for (const c of f.geometry!.coordinates) expect(Math.abs((Math.abs(c) * 100) % 10 - 5)).toBeLessThan(1e-6);
      expect(f.properties.dataGeneralizations).toContain('0.1° cell of the latitude-longitude grid');
    }
  }, 180_000);
});

describe('batch --sensitive-column', () => {
  it('generalises the marked rows to the grid of --generalise-to', async () => {
    const out = rowsOf(await batch(marked, 'marked-out.csv', '--sensitive-column', 'withhold', '--generalise-to', '0.1'));
    const header = out[0];
    const lat = header.indexOf('proposed_decimalLatitude');
    let generalised = 0;
    for (const row of out.slice(1)) {
      const isMarked = row[header.indexOf('withhold')] === 'yes';
      if (isMarked && row[lat] !== '') {
        generalised++;
        expect(row[lat]).toMatch(/^-?\d+\.\d5$/); // a 0.1° cell's centre
        expect(row.at(-3)).toContain('0.1° cell of the latitude-longitude grid');
      } else {
        expect(row.slice(-3, -1)).toEqual(['', '']);
      }
    }
    expect(generalised).toBeGreaterThan(0);
  }, 180_000);

  it('refuses --sensitive-column without a grid, and a list without gridDegrees, with a clear error', async () => {
    await expect(whereabouts('batch', marked, '--out', join(dir, 'x.csv'), '--sensitive-column', 'withhold')).rejects.toThrow(/--sensitive-column needs --generalise-to/);
    const bad = join(dir, 'bad-taxa.csv');
    writeFileSync(bad, 'scientificName,gridKm\nTelmoa ambigua,1\n');
    await expect(whereabouts('batch', input, '--out', join(dir, 'y.csv'), '--sensitive-taxa', bad)).rejects.toThrow(/needs the column scientificName and at least one of gridDegrees, gridMeters, distanceMeters/);
    await expect(whereabouts('batch', marked, '--out', join(dir, 'z.csv'), '--sensitive-column', 'withhold', '--generalise-to', '0.1', '--generalise-within', '500')).rejects.toThrow(/--sensitive-column: give exactly one of --generalise-to .* not --generalise-to and --generalise-within/);
  }, 60_000);
});

/** The job's id, as the CLI prints it on standard error when it starts. */
async function batchJob(inputPath: string, out: string, ...options: string[]): Promise<string> {
  const { stderr } = await whereabouts('batch', inputPath, '--out', out, '--run-timestamp', RUN_AT, ...options);
  return /batch job (\S+)/.exec(stderr)![1]!;
}

const jobsPath = `${db.replace(/\.sqlite$/, '')}.jobs.sqlite`;
const withheldOf = (jobId: string) => withheldRows(jobsPath, jobId);
/** The list's grids are 0.1° and 0.01°: a value on a 0.01° line may be a cell's corner. */
const holds = (bytes: Buffer, value: string) => holdsCoordinate(bytes, value, 0.01);

describe('a grid in meters and a stated distance, from the taxa list', () => {
  it('moves listed rows to the centre of a UTM cell of the side given, or within the distance given, and the radius covers it', async () => {
    const meterTaxa = join(dir, 'taxa-meters.csv');
    writeFileSync(meterTaxa, 'scientificName,gridDegrees,gridMeters,distanceMeters\nVerdemaria lindoensis,,2000,\nSerenella alticola,,,5000\n');
    const out = join(dir, 'meters.csv');
    const jobId = await batchJob(input, out, '--sensitive-taxa', meterTaxa);
    const rows = rowsOf(readFileSync(out, 'utf8'));
    const header = rows[0]!;
    // A term the demo input has already (decimalLatitude …) is appended as proposed_<term>.
    const at = (t: string) => (header.includes(`proposed_${t}`) ? header.indexOf(`proposed_${t}`) : header.indexOf(t));
    const withheld = withheldOf(jobId);
    expect(withheld.size).toBeGreaterThanOrEqual(8);
    for (const [row, precise] of withheld) {
      const r = rows[row]!;
      const shown: [number, number] = [Number(r[at('decimalLatitude')]), Number(r[at('decimalLongitude')])];
      const away = vincenty(shown, [Number(precise.decimalLatitude), Number(precise.decimalLongitude)]);
      const radius = Number(r[at('coordinateUncertaintyInMeters')]);
      // The circle shown holds the precise circle (triangle inequality, Vincenty distance).
      expect(away + Number(precise.coordinateUncertaintyInMeters)).toBeLessThanOrEqual(radius);
      if (r[header.indexOf('scientificName')] === 'Serenella alticola') {
        expect(away).toBeLessThanOrEqual(5000 * 1.015); // within the stated distance (docs/method.md §8: to 1.5 %)
        expect(r.at(-3)).toMatch(/within 5000 m of the precise point/);
      } else {
        // A 2000 m cell: the point is in it, so no farther from the centre than the half-diagonal, √2 × 1000 m (to UTM's scale factor).
        expect(away).toBeLessThanOrEqual(1000 * Math.SQRT2 * 1.001);
        expect(r.at(-3)).toMatch(/^Coordinates generalized from the original georeference to the centre of a 2000 m cell of the UTM zone \d+S grid \(WGS 84\)/);
      }
    }
  }, 180_000);
});

describe('the precise point is in no shared output: CSV, GeoJSON, GeoPackage, Darwin Core Archive', () => {
  const inputBytes = () => readFileSync(listedOnly);
  /** The precise coordinates and footprints a job withheld, but those the input itself holds (the holder's own columns, kept as they came). */
  const preciseValues = (jobId: string) =>
    [...withheldOf(jobId).values()].flatMap((p) => [p.decimalLatitude!, p.decimalLongitude!, p.footprintWKT!]).filter((v) => v !== '' && !inputBytes().includes(Buffer.from(v)));

  for (const format of ['csv', 'geojson', 'gpkg'] as const) {
    it(`batch --format ${format}`, async () => {
      const out = join(dir, `shared.${format}`);
      const jobId = await batchJob(listedOnly, out, '--sensitive-taxa', taxa, '--format', format);
      const values = preciseValues(jobId);
      expect(values.length).toBeGreaterThanOrEqual(16);
      const bytes = readFileSync(out);
      for (const value of values) expect(holds(bytes, value), value).toBe(false);
      // The generalised rows are there: their terms are in the file.
      expect(bytes.includes(Buffer.from('Coordinates generalized from the original georeference'))).toBe(true);
    }, 180_000);
  }

  it('a Darwin Core Archive in, a new archive out (guide: Darwin Core text guide, TDWG 2023)', async () => {
    const terms = readFileSync(listedOnly, 'utf8').split(/\r?\n/)[0]!.split(',');
    const meta = `<?xml version="1.0" encoding="UTF-8"?>
<archive xmlns="http://rs.tdwg.org/dwc/text/">
  <core encoding="UTF-8" fieldsTerminatedBy="," linesTerminatedBy="\\n" fieldsEnclosedBy='"' ignoreHeaderLines="1" rowType="http://rs.tdwg.org/dwc/terms/Occurrence">
    <files><location>occurrence.txt</location></files>
    <id index="0"/>
${terms.map((t, i) => `    <field index="${i}" term="http://rs.tdwg.org/dwc/terms/${t}"/>`).join('\n')}
  </core>
</archive>`;
    const archive = join(dir, 'records.zip');
    const zip = new yazl.ZipFile();
    zip.addBuffer(Buffer.from(meta), 'meta.xml');
    zip.addBuffer(inputBytes(), 'occurrence.txt');
    zip.end();
    await pipeline(zip.outputStream, createWriteStream(archive));
    const out = join(dir, 'records-georeferenced.zip');
    const jobId = await batchJob(archive, out, '--sensitive-taxa', taxa);
    const values = preciseValues(jobId);
    expect(values.length).toBeGreaterThanOrEqual(16);
    const entries = await unzip(out);
    expect(entries.map((e) => e.name)).toEqual(expect.arrayContaining(['meta.xml', 'occurrence.txt']));
    for (const { name, bytes } of entries) for (const value of values) expect(holds(bytes, value), `${name}: ${value}`).toBe(false);
    const core = entries.find((e) => e.name === 'occurrence.txt')!.bytes.toString('utf8');
    expect(core).toContain('Coordinates generalized from the original georeference');
    // meta.xml names each appended column at its index (Darwin Core text guide §2.4), the two terms under the dwc namespace.
    const header = core.split('\r\n')[0]!.split('\t');
    const metafile = entries.find((e) => e.name === 'meta.xml')!.bytes.toString('utf8');
    for (const term of ['dataGeneralizations', 'informationWithheld', 'decimalLatitude', 'footprintWKT']) {
      const index = header.findIndex((h) => h === term || h === `proposed_${term}`);
      expect(index, term).toBeGreaterThan(0);
      expect(metafile).toMatch(new RegExp(`<field index="${index}" term="http://(rs\\.tdwg\\.org/dwc/terms|whereabouts\\.invalid/terms)/(proposed_)?${term}"/>`));
    }
    expect(metafile).toContain('term="http://rs.tdwg.org/dwc/terms/dataGeneralizations"');
    // The archive's metadata says rows were generalised, by whose list, and that the precise points stayed out.
    const eml = entries.find((e) => e.name === 'eml.xml')!.bytes.toString('utf8');
    expect(eml).toMatch(/records of the \d+ (taxon|taxa) on the holder's list of sensitive taxa were generalised/);
    expect(eml).toContain('the precise georeferences are not in this archive');
  }, 180_000);
});
