/**
 * A shapefile's .dbf is read in the code page its .cpg names, else the one its header's language driver id
 * names (byte 29), else windows-1252; the DOS code pages (437, 850, 852, 866…) included. The one-point shapefile is written here byte by byte (invented data) from the published
 * layouts: the .shp from the ESRI Shapefile Technical Description (1998, pp. 3–5: 100-byte header, a
 * record header of number and length in 16-bit words, big-endian; shape type 1, X and Y little-endian),
 * the .dbf from the dBASE III header (32 bytes: version, date, record count at 4, header length at 8,
 * record length at 10, language driver at 29; 32-byte field descriptors ended by 0x0D; records flagged by
 * a space, the file ended by 0x1A).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { readGisFile, type GisRow } from '../../src/store/gis-import.ts';
import { gdalAvailable, ogrFeatures } from '../support/gdal.ts';

const WGS84_PRJ = 'GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';

/** One point at (x, y), the .shp's 100-byte header and one 28-byte record. */
function pointShp(x: number, y: number): Buffer {
  const shp = Buffer.alloc(128);
  shp.writeInt32BE(9994, 0);
  shp.writeInt32BE(shp.length / 2, 24);
  shp.writeInt32LE(1000, 28);
  shp.writeInt32LE(1, 32);
  [x, y, x, y].forEach((v, i) => shp.writeDoubleLE(v, 36 + 8 * i));
  shp.writeInt32BE(1, 100);
  shp.writeInt32BE(10, 104);
  shp.writeInt32LE(1, 108);
  shp.writeDoubleLE(x, 112);
  shp.writeDoubleLE(y, 120);
  return shp;
}

/** A .dbf of one record with character fields id (10) and name (30), the name's bytes given. */
function dbf(languageDriver: number, id: string, name: Buffer): Buffer {
  const fields: [string, number][] = [['id', 10], ['name', 30]];
  const headerLength = 32 + 32 * fields.length + 1;
  const recordLength = 1 + fields.reduce((sum, [, length]) => sum + length, 0);
  const file = Buffer.alloc(headerLength + recordLength + 1, 0x20);
  file.fill(0, 0, headerLength);
  file[0] = 0x03;
  file.writeUInt32LE(1, 4);
  file.writeUInt16LE(headerLength, 8);
  file.writeUInt16LE(recordLength, 10);
  file[29] = languageDriver;
  fields.forEach(([fieldName, length], i) => {
    file.write(fieldName, 32 + 32 * i, 'latin1');
    file[32 + 32 * i + 11] = 'C'.charCodeAt(0);
    file[32 + 32 * i + 16] = length;
  });
  file[headerLength - 1] = 0x0d;
  file.write(id, headerLength + 1, 'latin1');
  name.copy(file, headerLength + 1 + 10);
  file[file.length - 1] = 0x1a;
  return file;
}

async function readNames(languageDriver: number, name: Buffer, cpg?: string): Promise<{ names: string[]; notes: string[] }> {
  const dir = mkdtempSync(join(tmpdir(), 'wb-ldid-'));
  writeFileSync(join(dir, 'places.shp'), pointShp(31.5, 49.25));
  writeFileSync(join(dir, 'places.dbf'), dbf(languageDriver, 'p1', name));
  writeFileSync(join(dir, 'places.prj'), WGS84_PRJ);
  if (cpg !== undefined) writeFileSync(join(dir, 'places.cpg'), cpg);
  return namesIn(join(dir, 'places.shp'));
}

async function namesIn(file: string, field = 'name'): Promise<{ names: string[]; notes: string[] }> {
  const notes: string[] = [];
  const rows: GisRow[] = [];
  for await (const chunk of readGisFile(file, 'shapefile', { nameField: field, featureType: 'populatedPlace' }, notes)) rows.push(...chunk);
  return { names: rows.map((r) => (typeof r.raw === 'string' ? r.raw : String(r.raw.name))), notes };
}

describe('a .dbf without a .cpg is read in its language driver code page', () => {
  // invented Cyrillic name; its Windows-1251 bytes by iconv-lite, a second implementation of the code page
  const name = 'Берёзовый Лог';
  const cp1251 = iconv.encode(name, 'windows-1251');

  it('driver 0xC9 (Windows-1251) gives the Cyrillic name, and the note says why', async () => {
    const { names, notes } = await readNames(0xc9, cp1251);
    expect(names).toEqual([name]);
    expect(notes.join('\n')).toMatch(/read as windows-1251 \(its header's language driver 0xc9\)/);
  });

  it('a driver byte outside the table (0x00) falls back to windows-1252, as before', async () => {
    const { names, notes } = await readNames(0x00, cp1251);
    expect(names).toEqual([iconv.decode(cp1251, 'windows-1252')]);
    expect(notes.join('\n')).toMatch(/read as windows-1252 \(the dBASE convention\)/);
  });

  it('UTF-8 bytes are read as UTF-8 whatever the driver byte says', async () => {
    expect((await readNames(0xc9, Buffer.from(name, 'utf8'))).names).toEqual([name]);
  });
});

describe('the DOS code pages, by the .cpg first, then the driver byte', () => {
  // invented names; their bytes in each code page by iconv-lite (a second implementation of the code
  // pages: IBM's tables as iconv-lite ships them). "Pará" ends in á, 0xA0 in 437 and 850, which is the
  // no-break space of windows-1252: a reader that trimmed before decoding would lose it.
  const latin = 'São Pará Québec';

  it.each([
    ['850', 'cp850', 'its .cpg says "850"'],
    ['CP850', 'cp850', 'its .cpg says "CP850"'],
    ['IBM850', 'cp850', 'its .cpg says "IBM850"'],
    ['437', 'cp437', 'its .cpg says "437"'],
    ['OEM', 'cp437', 'its .cpg says "OEM", taken as the US DOS code page 437'],
  ])('a .cpg saying %s is read as %s, over the driver byte 0xC9, and the note says why', async (cpg, encoding, why) => {
    const text = encoding === 'cp437' || cpg === '437' ? 'Pará Québec Goiás' : latin; // ã has no byte in 437
    const { names, notes } = await readNames(0xc9, iconv.encode(text, encoding), cpg);
    expect(names).toEqual([text]);
    expect(notes.join('\n')).toContain(`places.dbf read as ${encoding} (${why})`);
  });

  it.each([
    ['0x01', 0x01, 'cp437', 'Pará Québec Goiás'],
    ['0x02', 0x02, 'cp850', latin],
    ['0x64', 0x64, 'cp852', 'Łódź Brno Žilina'],
    ['0x65', 0x65, 'cp866', 'Берёзовый Лог'],
    ['0x26', 0x26, 'cp866', 'Берёзовый Лог'],
  ])('without a .cpg, driver %s is read as %s', async (hex, driver, encoding, text) => {
    const { names, notes } = await readNames(driver, iconv.encode(text, encoding));
    expect(names).toEqual([text]);
    expect(notes.join('\n')).toContain(`has no .cpg: read as ${encoding} (its header's language driver ${hex})`);
  });
});

/**
 * Real files: Natural Earth's 1:50m admin-1 states and provinces (public domain, naturalearthdata.com;
 * source and commands in test/fixtures/real/README.md), cut to a few states with accented names and written
 * by GDAL 3.6.2's ogr2ogr in CP850 (with a .cpg "CP850") and in CP437 (ENCODING=LDID/1: driver byte 0x01, no
 * .cpg). Expected: the names as the UTF-8 source (ne_50m_admin_1_states_provinces.json) writes them, and as
 * GDAL's ogrinfo reads the same files.
 */
const real = new URL('../fixtures/real/gis/', import.meta.url).pathname;
const hasGdal = gdalAvailable('test/store/dbf-language-driver.test.ts (real files)');

describe('Natural Earth states written by GDAL in DOS code pages', () => {
  const cases = [
    {
      file: 'natural-earth-admin-1-cp850.zip', note: 'admin1.dbf read as cp850 (its .cpg says "CP850")',
      names: ['Rondônia', 'Pará', 'Goiás', 'São Paulo', 'Maranhão', 'Espírito Santo', 'Québec'],
      alternates: ['Guaporé', '', 'Goiáz|Goyáz', '', 'São Luíz de Maranhão', 'Espiritu Santo', 'Lower Canada'],
    },
    {
      file: 'natural-earth-admin-1-cp437.zip', note: "admin1.dbf has no .cpg: read as cp437 (its header's language driver 0x01)",
      names: ['Rondônia', 'Pará', 'Goiás', 'Piauí', 'Espírito Santo', 'Québec'],
      alternates: ['Guaporé', '', 'Goiáz|Goyáz', 'Piauhy', 'Espiritu Santo', 'Lower Canada'],
    },
  ];

  it.each(cases)('$file: every name and alternate name as the UTF-8 source writes it, and the note says which encoding and why', async ({ file, note, names, alternates }) => {
    const read = await namesIn(join(real, file));
    expect(read.names).toEqual(names);
    expect(read.notes).toContain(`${note}; give --encoding if its names look wrong`);
    expect((await namesIn(join(real, file), 'name_alt')).names.map((n) => (n === 'undefined' ? '' : n))).toEqual(alternates);
  });

  it.skipIf(!hasGdal).each(cases)('$file: the same names as ogrinfo reads them', async ({ file }) => {
    const byGdal = ogrFeatures(`/vsizip/${join(real, file)}`).map((f) => f.fields.name);
    expect((await namesIn(join(real, file))).names).toEqual(byGdal);
  });
});
