/**
 * Darwin Core Archives through the real CLI: an archive built in the test by the rules of the Darwin
 * Core text guide (Darwin Core Maintenance Group 2023, TDWG, http://rs.tdwg.org/dwc/terms/guides/text/;
 * "guide §" below) from invented demo records, georeferenced by `whereabouts batch`, and the archive that
 * comes back checked against the same rules. Zips are read back with yauzl, XML with saxes, CSV with
 * csv-parse: libraries independent of the code under test.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { SaxesParser } from 'saxes';
import { beforeAll, describe, expect, it } from 'vitest';
import { unzip } from './helpers.ts';
import { ARCHIVE_FILES, coreBytes, coreRows, DWC, eml, metaXml, multimedia, SHORT_ROW, zipFiles } from '../support/demo-archive.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-dwca-'));
const db = join(dir, 'demo.sqlite');

function whereabouts(...args: string[]) {
  return run(process.execPath, [cli, '--db', db, ...args], { cwd: root, maxBuffer: 64 << 20 });
}

/** Elements of an XML document (saxes), each with its attributes and its parent's name. */
function elements(xml: string): { name: string; parent: string; attributes: Record<string, string> }[] {
  const parser = new SaxesParser({ xmlns: true });
  const stack: string[] = [];
  const found: { name: string; parent: string; attributes: Record<string, string> }[] = [];
  parser.on('opentag', (tag) => {
    found.push({ name: tag.local, parent: stack[stack.length - 1] ?? '', attributes: Object.fromEntries(Object.values(tag.attributes).map((a) => [a.local, a.value])) });
    if (!tag.isSelfClosing) stack.push(tag.local);
  });
  parser.on('closetag', (tag) => {
    if (!tag.isSelfClosing) stack.pop();
  });
  parser.write(xml).close();
  return found;
}

const input = join(dir, 'dwca.zip');
const output = join(dir, 'dwca-georeferenced.zip');
let entries: { name: string; bytes: Buffer }[];

beforeAll(async () => {
  await whereabouts('import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
  await zipFiles(input, ARCHIVE_FILES);
  await whereabouts('batch', input, '--out', output, '--quiet');
  entries = await unzip(output);
}, 180_000);

const entry = (name: string) => entries.find((e) => e.name === name)!.bytes;

describe('batch over a Darwin Core Archive', () => {
  it('keeps every file; the extension byte for byte (guide §2.1: extensions relate to the core by coreid, untouched)', () => {
    expect(entries.map((e) => e.name)).toEqual(['meta.xml', 'eml.xml', 'occurrence.txt', 'multimedia.txt']);
    expect(entry('multimedia.txt').equals(multimedia)).toBe(true);
  });

  it('adds one method step to eml.xml, before <project> (EML 2.2.0 eml-dataset order), every other byte unchanged', () => {
    const text = entry('eml.xml').toString('utf8');
    const step = /<methods><methodStep>[\s\S]*?<\/methodStep><\/methods>/.exec(text)!;
    expect(step).not.toBeNull();
    expect(Buffer.from(text.replace(step[0], ''), 'utf8').equals(eml)).toBe(true);
    expect(text.indexOf('<methods>')).toBeLessThan(text.indexOf('<project>'));
    const description = step[0];
    expect(description).toMatch(/whereabouts \d+\.\d+\.\d+/);
    expect(description).toContain('Isla Verdemar demo gazetteer (invented)');
    expect(description).toMatch(/sha256 [0-9a-f]{64}/);
    expect(elements(text).filter((e) => e.name === 'methodStep')).toHaveLength(1);
  });

  it('describes the new core in a well-formed meta.xml: delimiters, encoding, header line, every column by index (guide §2.2, §2.4)', () => {
    const meta = elements(entry('meta.xml').toString('utf8'));
    const core = meta.find((e) => e.name === 'core')!;
    expect(core.attributes).toMatchObject({ encoding: 'UTF-8', fieldsTerminatedBy: '\\t', linesTerminatedBy: '\\r\\n', fieldsEnclosedBy: '"', ignoreHeaderLines: '1', rowType: `${DWC}Occurrence` });
    expect(meta.find((e) => e.name === 'id' && e.parent === 'core')!.attributes.index).toBe('0');
    const fields = meta.filter((e) => e.name === 'field' && e.parent === 'core').map((e) => e.attributes);
    const header = (parse(entry('occurrence.txt'), { delimiter: '\t', to_line: 1 }) as string[][])[0];
    // Every field has an index within the header and a term (guide §2.4: term required); no index twice.
    const indexes = fields.map((f) => Number(f.index));
    expect(new Set(indexes).size).toBe(fields.length);
    for (const f of fields) {
      expect(Number(f.index)).toBeLessThan(header.length);
      expect(f.term).toMatch(/^https?:\/\//);
    }
    // The constant field now fills a column of its own and keeps its default (guide §2.4 default).
    const countryCode = fields.find((f) => f.term === `${DWC}countryCode`)!;
    expect(countryCode.default).toBe('QV');
    expect(header[Number(countryCode.index)]).toBe('countryCode');
    // Appended Darwin Core terms the core lacked are described as the terms; a proposal beside a term
    // the core has (decimalLatitude) is not the term, and says so by its own namespace.
    const byHeader = new Map(fields.map((f) => [header[Number(f.index)], f.term]));
    expect(byHeader.get('coordinateUncertaintyInMeters')).toBe(`${DWC}coordinateUncertaintyInMeters`);
    expect(byHeader.get('decimalLatitude')).toBe(`${DWC}decimalLatitude`);
    expect(byHeader.get('proposed_decimalLatitude')).not.toBe(`${DWC}decimalLatitude`);
    expect(byHeader.get('proposed_decimalLatitude')).toMatch(/proposed_decimalLatitude$/);
    // The extension is described as before.
    const extension = meta.find((e) => e.name === 'extension')!;
    expect(extension.attributes).toMatchObject({ rowType: 'http://rs.tdwg.org/ac/terms/Multimedia', fieldsTerminatedBy: ',', linesTerminatedBy: '\\n', fieldsEnclosedBy: '"' });
    expect(meta.filter((e) => e.parent === 'extension' && e.name === 'field').map((e) => e.attributes.term)).toEqual(['http://purl.org/dc/terms/identifier', 'http://purl.org/dc/terms/format']);
  });

  it('returns every core row once, in order, its values unchanged (decoded from Windows-1252), each with a status', () => {
    // A column meta.xml does not describe keeps its name from the header line (guide §2.2 ignoreHeaderLines).
    expect((parse(entry('occurrence.txt'), { delimiter: '\t', to_line: 1 }) as string[][])[0][5]).toBe('note');
    const rows = parse(entry('occurrence.txt'), { delimiter: '\t', record_delimiter: '\r\n', quote: '"' }) as string[][];
    const [header, ...body] = rows;
    expect(body).toHaveLength(coreRows.length);
    const status = header.indexOf('georeferenceVerificationStatus');
    body.forEach((row, i) => {
      // guide §2.4 default: an empty stateProvince is the field's default, and is written as it.
      const expected = coreRows[i].map((v, k) => (k === 6 && v === '' ? 'Poniente' : v));
      expect(row.slice(0, expected.length)).toEqual(expected);
      // The constant fills every whole row; the row cut short is kept as written (it is reported, not mended).
      expect(row[header.indexOf('countryCode')]).toBe(i === SHORT_ROW ? '' : 'QV');
      expect(['requires verification', 'requires georeference', 'unable to georeference']).toContain(row[status]);
    });
    expect(body.some((r) => r[3] === 'junction of Río Claro and Arroyo Negro')).toBe(true);
    expect(coreRows.some((r) => r[6] === 'Serra Alta') && body.some((r) => r[6] === 'Serra Alta')).toBe(true);
    expect(body[SHORT_ROW][status]).toBe('unable to georeference');
    expect(body[SHORT_ROW][header.indexOf('georeferenceRemarks')]).toMatch(/the row has 3 fields where the header has 8/);
    // The record that had decimalLatitude keeps it; the proposal stands beside it.
    expect(body[0][header.indexOf('decimalLatitude')]).toBe('-45.1');
    expect(body[0][header.indexOf('proposed_decimalLatitude')]).toMatch(/^-4\d\.\d+$/);
  });
});

describe('an archive whose files sit in one folder, its meta.xml with a byte order mark', () => {
  it('is read from that folder (guide §2.3: locations relative to the metafile) and written back the same way', async () => {
    const nested = join(dir, 'nested.zip');
    const out = join(dir, 'nested-out.zip');
    const bom = Buffer.from([0xef, 0xbb, 0xbf]);
    await zipFiles(nested, [['dwca/meta.xml', Buffer.concat([bom, Buffer.from(metaXml)])], ['dwca/occurrence.txt', coreBytes], ['dwca/multimedia.txt', multimedia]]);
    await whereabouts('batch', nested, '--out', out, '--quiet');
    const files = await unzip(out);
    expect(files.map((f) => f.name)).toEqual(['dwca/meta.xml', 'dwca/occurrence.txt', 'dwca/multimedia.txt', 'dwca/eml.xml']);
    const rows = parse(files[1].bytes, { delimiter: '\t', record_delimiter: '\r\n' }) as string[][];
    expect(rows).toHaveLength(coreRows.length + 1);
    // No metadata in the archive: a minimal EML document holding the method step (EML 2.2.0).
    expect(elements(files[3].bytes.toString('utf8')).filter((e) => e.name === 'methodStep')).toHaveLength(1);
  });
});

describe('archive input errors', () => {
  it('a zip without meta.xml is refused with a message saying why, exit 1', async () => {
    const plainZip = join(dir, 'plain.zip');
    await zipFiles(plainZip, [['records.csv', Buffer.from('occurrenceID,locality\nx1,Vila Serena\n')]]);
    const failed = await whereabouts('batch', plainZip, '--out', join(dir, 'plain-out.zip'), '--quiet').then(() => undefined, (e: { code: number; stderr: string }) => e);
    expect(failed?.code).toBe(1);
    expect(failed?.stderr).toMatch(/is a ZIP archive, not CSV or tab-separated text: whereabouts reads a Darwin Core Archive \(a zip with a meta\.xml\)/);
  });

  it('a core of another row type is refused, naming it (guide §2.2 rowType)', async () => {
    const taxa = join(dir, 'taxa.zip');
    await zipFiles(taxa, [['meta.xml', Buffer.from(metaXml.replace(`${DWC}Occurrence`, `${DWC}Taxon`))], ['occurrence.txt', coreBytes]]);
    const failed = await whereabouts('batch', taxa, '--out', join(dir, 'taxa-out.zip'), '--quiet').then(() => undefined, (e: { code: number; stderr: string }) => e);
    expect(failed?.code).toBe(1);
    expect(failed?.stderr).toContain(`${DWC}Taxon`);
  });
});

describe('an archive whose core maps no locality term', () => {
  it('is refused naming the columns it has, and leaves no file behind', async () => {
    const noLocality = join(dir, 'no-locality.zip');
    await zipFiles(noLocality, [['meta.xml', Buffer.from(metaXml.replace(`${DWC}locality"`, `${DWC}habitat"`))], ['occurrence.txt', coreBytes]]);
    const before = readdirSync(dir).sort();
    const failed = await whereabouts('batch', noLocality, '--out', join(dir, 'no-locality-out.zip'), '--quiet').then(() => undefined, (e: { code: number; stderr: string }) => e);
    expect(failed?.code).toBe(1);
    expect(failed?.stderr).toMatch(/no "locality" or "verbatimLocality" column.*"habitat"/);
    expect(readdirSync(dir).sort()).toEqual(before);
  });
});

describe("a portal's plain tab-separated download", () => {
  it('reads full term URIs as the header (guide §1: a header of term names; §2.4 term URIs) and proposes beside the terms it has', async () => {
    const tsv = join(dir, 'download.txt');
    const header = ['occurrenceID', 'locality', 'countryCode', 'decimalLatitude'].map((t) => DWC + t);
    writeFileSync(tsv, [header, ['qvh-occ-0002', 'Vila Serena', 'QV', '']].map((r) => r.join('\t')).join('\n') + '\n');
    const out = join(dir, 'download-georeferenced.txt');
    await whereabouts('batch', tsv, '--out', out, '--quiet');
    const [head, row] = parse(readFileSync(out), { delimiter: '\t' }) as string[][];
    expect(head.slice(0, 4)).toEqual(header);
    expect(head).toContain('proposed_decimalLatitude');
    expect(head).not.toContain('decimalLatitude');
    expect(row[head.indexOf('georeferenceVerificationStatus')]).toBe('requires verification');
  });
});
