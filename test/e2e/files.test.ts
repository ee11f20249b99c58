/**
 * The files a new user hands the real CLI first: a gazetteer exported in Windows-1252 or UTF-16, one
 * whose every row is refused, a batch against a store with no gazetteer loaded, and workbooks, archives
 * and other binary files given where CSV text is expected. Child processes and real SQLite files.
 * Encodings: Windows-1252 bytes made by iconv-lite (Microsoft's code page), UTF-16LE by Node's encoder
 * with the byte order mark of the Unicode Standard §23.8. File signatures: ZIP (PKWARE APPNOTE §4.3.7,
 * local file header "PK\3\4"), Compound File Binary (Microsoft [MS-CFB] §2.2, D0 CF 11 E0 A1 B1 1A E1),
 * PDF (ISO 32000-1 §7.5.2, "%PDF-"), gzip (RFC 1952 §2.3.1, 1F 8B).
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { gzipSync } from 'node:zlib';
import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-files-'));

/** The CLI's exit status and what it printed, whether it succeeded or not. */
async function whereabouts(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, [cli, ...args], { cwd: dir, maxBuffer: 64 << 20 });
    return { code: 0, stdout, stderr };
  } catch (error) {
    const e = error as { code: number; stdout: string; stderr: string };
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}

/** Invented places on Isla Verdemar (QV), with the accents Windows-1252 holds in one byte each. */
const GAZETTEER = [
  'id,name,alternateNames,latitude,longitude,featureType,countryCode,stateProvince,county,radiusMeters',
  'w-1,Pont-Étoile,Pont Étoile,-45.31,-131.12,village,QV,Poniente,Alisos,1500',
  'w-2,São Tomé da Praia,,-45.42,-131.05,village,QV,Poniente,Alisos,1200',
  'w-3,Peñón Alto,,-45.2,-131.3,hill,QV,Serra Alta,,800',
  '',
].join('\r\n');

describe('whereabouts import reads a gazetteer in the encoding it was saved in', () => {
  it('imports a Windows-1252 file with every row, names intact, and says which encoding it read', async () => {
    const db = join(dir, 'cp1252.sqlite');
    const file = join(dir, 'lugares.csv');
    writeFileSync(file, iconv.encode(GAZETTEER, 'windows-1252'));
    expect(readFileSync(file).includes(0xc9)).toBe(true); // É is the single byte C9 in Windows-1252
    const imported = await whereabouts('--db', db, 'import', file, '--source', 'Lugares de Isla Verdemar (invented), 2026');
    expect(imported.stderr).toBe('');
    expect(imported.code).toBe(0);
    expect(imported.stdout).toMatch(/^source lugares: 3 rows read, 3 imported, 0 rejected/);
    expect(imported.stdout).toContain('read as windows-1252');
    const located = JSON.parse((await whereabouts('--db', db, 'locate', 'Pont-Étoile', '--country-code', 'QV', '--json')).stdout);
    expect(located.status).toBe('georeferenced');
    expect(located.candidates[0].feature.name).toBe('Pont-Étoile');
    const listed = JSON.parse((await whereabouts('--db', db, 'gazetteer', 'list', '--json')).stdout);
    expect(listed).toMatchObject([{ id: 'lugares', citation: 'Lugares de Isla Verdemar (invented), 2026', featureCount: 3 }]);
  });

  it('imports a UTF-16LE file with a byte order mark', async () => {
    const db = join(dir, 'utf16.sqlite');
    const file = join(dir, 'utf16.csv');
    writeFileSync(file, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(GAZETTEER, 'utf16le')]));
    const imported = await whereabouts('--db', db, 'import', file, '--citation', 'UTF-16 test gazetteer (invented)');
    expect(imported.code).toBe(0);
    expect(imported.stdout).toMatch(/3 imported, 0 rejected/);
    expect(imported.stdout).toContain('read as utf-16le');
    const listed = JSON.parse((await whereabouts('--db', db, 'gazetteer', 'list', '--json')).stdout);
    expect(listed[0].citation).toBe('UTF-16 test gazetteer (invented)');
  });

  it('builds a stand-in citation from the file, never its folder, and says to replace it', async () => {
    const db = join(dir, 'standin.sqlite');
    const file = join(dir, 'sin-cita.csv');
    writeFileSync(file, GAZETTEER);
    const imported = await whereabouts('--db', db, 'import', file);
    expect(imported.code).toBe(0);
    expect(imported.stdout).toMatch(/citation: sin-cita\.csv \([\d,]+ bytes, sha256 [0-9a-f]{12}, imported \d{4}-\d\d-\d\d; no citation given\)/);
    expect(imported.stdout).toMatch(/replace it with a real citation .*--source/);
    const listed = JSON.parse((await whereabouts('--db', db, 'gazetteer', 'list', '--json')).stdout);
    expect(listed[0].citation).not.toContain(dir);
  });

  it('fails, registering nothing, when no row can be kept', async () => {
    const db = join(dir, 'refused.sqlite');
    await whereabouts('--db', db, 'import', join(dir, 'lugares.csv'), '--source', 'kept source');
    const file = join(dir, 'todo-mal.csv');
    writeFileSync(file, 'id,name,latitude,longitude\nx-1,Uno,95,-131\nx-2,Dos,diez,-131\n');
    const refused = await whereabouts('--db', db, 'import', file, '--source', 'bad source');
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(/none of the 2 rows of todo-mal\.csv could be imported, so nothing was registered \(row 2: latitude 95/);
    const listed = JSON.parse((await whereabouts('--db', db, 'gazetteer', 'list', '--json')).stdout);
    expect(listed.map((s: { id: string }) => s.id)).toEqual(['lugares']);
  });
});

describe('whereabouts batch refuses what it cannot answer', () => {
  const records = join(dir, 'records.csv');
  writeFileSync(records, 'occurrenceID,locality,countryCode\nr-1,Pont-Étoile,QV\nr-2,Peñón Alto,QV\n');

  it('refuses a batch against a store with no gazetteer, naming the store and the import verb', async () => {
    const db = join(dir, 'empty.sqlite');
    await whereabouts('--db', db, 'import', join(dir, 'lugares.csv'), '--source', 'to be removed');
    expect((await whereabouts('--db', db, 'gazetteer', 'remove', 'lugares')).code).toBe(0);
    const refused = await whereabouts('--db', db, 'batch', records, '--out', join(dir, 'out.csv'), '--quiet');
    expect(refused.code).toBe(1);
    expect(refused.stderr).toContain(`the gazetteer ${db} holds no source`);
    expect(refused.stderr).toContain('whereabouts import <file>');
    const allowed = await whereabouts('--db', db, 'batch', records, '--out', join(dir, 'out.csv'), '--quiet', '--allow-empty-gazetteer');
    expect(allowed.code).toBe(0);
    expect(readFileSync(join(dir, 'out.csv'), 'utf8').match(/requires georeference/g)).toHaveLength(2);
  });

  const db = join(dir, 'cp1252.sqlite');
  /** A ZIP local file header holding one entry of this name (PKWARE APPNOTE §4.3.7), stored, empty. */
  const zipWith = (name: string, content = '') => {
    const header = Buffer.alloc(30);
    header.writeUInt32LE(0x04034b50, 0);
    header.writeUInt16LE(20, 4);
    header.writeUInt32LE(content.length, 18);
    header.writeUInt32LE(content.length, 22);
    header.writeUInt16LE(Buffer.byteLength(name), 26);
    return Buffer.concat([header, Buffer.from(name), Buffer.from(content)]);
  };
  const CASES: { name: string; bytes: Buffer; says: RegExp }[] = [
    { name: 'records.xlsx', bytes: zipWith('[Content_Types].xml', '<Types/>'), says: /is an Excel workbook \(\.xlsx, a ZIP archive\), not CSV or tab-separated text: export the sheet as CSV \(UTF-8\)/ },
    { name: 'records.ods', bytes: zipWith('mimetype', 'application/vnd.oasis.opendocument.spreadsheet'), says: /is an OpenDocument spreadsheet \(\.ods, a ZIP archive\).*export the sheet as CSV/ },
    { name: 'records.zip', bytes: zipWith('occurrence.txt', 'id\tlocality\n'), says: /is a ZIP archive, not CSV or tab-separated text: .*unpack the archive and give the records file inside/ },
    { name: 'records.xls', bytes: Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0]), says: /is an Excel 97–2003 workbook \(\.xls\).*export the sheet as CSV/ },
    { name: 'records.pdf', bytes: Buffer.from('%PDF-1.7\n%âãÏÓ\n'), says: /is a PDF document/ },
    { name: 'records.csv.gz', bytes: gzipSync('occurrenceID,locality\nr-1,Pont-Étoile\n'), says: /is a gzip-compressed file.*gunzip/ },
  ];
  for (const { name, bytes, says } of CASES) {
    it(`names the format of ${name}, read by its content, and what to do`, async () => {
      // Named .csv whatever it is: the content decides, not the name.
      const file = join(dir, `${name}.csv`);
      writeFileSync(file, bytes);
      const refused = await whereabouts('--db', db, 'batch', file, '--out', join(dir, `${name}.out.csv`), '--quiet');
      expect(refused.code).toBe(1);
      expect(refused.stderr).toMatch(says);
    });
  }

  it('refuses a workbook given to import as well', async () => {
    const file = join(dir, 'gazetteer.csv');
    writeFileSync(file, zipWith('xl/workbook.xml'));
    const refused = await whereabouts('--db', db, 'import', file, '--source', 'x');
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(/gazetteer\.csv is an Excel workbook .* export the sheet as CSV/);
  });
});
