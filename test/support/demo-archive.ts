/**
 * A Darwin Core Archive built by the rules of the Darwin Core text guide (Darwin Core Maintenance Group
 * 2023, TDWG, http://rs.tdwg.org/dwc/terms/guides/text/; "guide §" below) from invented demo records,
 * for the tests of the CLI's batch and of the HTTP upload: a Windows-1252 tab-separated core with a
 * constant field, a column meta.xml does not describe and one row cut short, an Audubon Core multimedia
 * extension (rowType http://rs.tdwg.org/ac/terms/Multimedia) and EML metadata; and one of 4,000 rows, for
 * jobs stopped part way.
 */
import { createWriteStream, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { parse } from 'csv-parse/sync';
import iconv from 'iconv-lite';
import yazl from 'yazl';

const root = new URL('../..', import.meta.url).pathname;

/** A zip of the files given, in that order, written with yazl (not with the code under test). */
export async function zipFiles(path: string, files: [string, Buffer][]): Promise<void> {
  const zip = new yazl.ZipFile();
  for (const [name, bytes] of files) zip.addBuffer(bytes, name, { mtime: new Date('2026-01-01T00:00:00Z') });
  zip.end();
  await pipeline(zip.outputStream, createWriteStream(path));
}

// Invented demo records (gazetteer/demo-localities.csv), among them one written in Windows-1252 ("Río").
const demo = (parse(readFileSync(join(root, 'gazetteer/demo-localities.csv')), { columns: true }) as Record<string, string>[]).slice(0, 12);
export const DWC = 'http://rs.tdwg.org/dwc/terms/';

// guide §2.2: a tab-separated core with no enclosing character, CRLF line ends, one header line, in
// Windows-1252; guide §2.4: a field with a default and no index is a constant for every row, and a
// column the metafile does not describe (index 5, "note") is allowed.
export const coreHeader = ['id', 'catalogNumber', 'scientificName', 'locality', 'decimalLatitude', 'note', 'stateProvince'];
export const coreRows = demo.map((r, i) => [r.occurrenceID, r.catalogNumber, r.scientificName, r.locality, i === 0 ? '-45.1' : '', `note ${i}`, r.stateProvince]);
// One row cut short (three fields of seven): it must come back too, with a status saying why.
export const SHORT_ROW = 4;
coreRows[SHORT_ROW] = coreRows[SHORT_ROW].slice(0, 3);
export const coreBytes = iconv.encode([coreHeader, ...coreRows].map((r) => r.join('\t')).join('\r\n') + '\r\n', 'windows-1252');
export const metaXml = `<?xml version="1.0" encoding="UTF-8"?>
<archive xmlns="http://rs.tdwg.org/dwc/text/" metadata="eml.xml">
  <core encoding="windows-1252" fieldsTerminatedBy="\\t" linesTerminatedBy="\\r\\n" fieldsEnclosedBy="" ignoreHeaderLines="1" rowType="${DWC}Occurrence">
    <files><location>occurrence.txt</location></files>
    <id index="0"/>
    <field index="0" term="${DWC}occurrenceID"/>
    <field index="1" term="${DWC}catalogNumber"/>
    <field index="2" term="${DWC}scientificName"/>
    <field index="3" term="${DWC}locality"/>
    <field index="4" term="${DWC}decimalLatitude"/>
    <field index="6" term="${DWC}stateProvince" default="Poniente"/>
    <field term="${DWC}countryCode" default="QV"/>
  </core>
  <extension encoding="UTF-8" fieldsTerminatedBy="," linesTerminatedBy="\\n" fieldsEnclosedBy='"' ignoreHeaderLines="1" rowType="http://rs.tdwg.org/ac/terms/Multimedia">
    <files><location>multimedia.txt</location></files>
    <coreid index="0"/>
    <field index="1" term="http://purl.org/dc/terms/identifier"/>
    <field index="2" term="http://purl.org/dc/terms/format"/>
  </extension>
</archive>
`;
export const multimedia = Buffer.from('coreid,identifier,format\nqvh-occ-0001,"https://example.org/img/1.jpg",image/jpeg\nqvh-occ-0001,"https://example.org/img/2,b.jpg",image/jpeg\n', 'utf8');
export const eml = Buffer.from(`<?xml version="1.0" encoding="UTF-8"?>
<eml:eml xmlns:eml="https://eml.ecoinformatics.org/eml-2.2.0" packageId="qv-demo" system="demo">
  <dataset>
    <title>Herbario de Isla Verdemar — registros de demostración</title>
    <creator><organizationName>Herbario QVH (invented)</organizationName></creator>
    <contact><organizationName>Herbario QVH (invented)</organizationName></contact>
    <project><title>Demo</title></project>
  </dataset>
</eml:eml>
`, 'utf8');

/** The demo archive's files in the order they are zipped. */
export const ARCHIVE_FILES: [string, Buffer][] = [['meta.xml', Buffer.from(metaXml)], ['eml.xml', eml], ['occurrence.txt', coreBytes], ['multimedia.txt', multimedia]];

const PLACES = ['Caleta Brava', 'San Telmo', 'Pont-Étoile', 'São Bento', 'Puerto Ñandú'];

/** 4,000 invented occurrences (Darwin Core text guide §2.2: a comma-separated, quoted core with one header line). */
export async function writeManyRowArchive(path: string): Promise<void> {
  const rows = ['id,locality'];
  for (let i = 0; i < 4000; i++) rows.push(`o-${i},"${(i % 40) + 1} km N of ${PLACES[i % PLACES.length]}"`);
  const meta = `<archive xmlns="http://rs.tdwg.org/dwc/text/"><core ignoreHeaderLines="1" rowType="${DWC}Occurrence"><files><location>occurrence.csv</location></files><id index="0"/><field index="0" term="${DWC}occurrenceID"/><field index="1" term="${DWC}locality"/><field term="${DWC}countryCode" default="QV"/></core></archive>`;
  const zip = new yazl.ZipFile();
  zip.addBuffer(Buffer.from(meta), 'meta.xml');
  zip.addBuffer(Buffer.from(`${rows.join('\n')}\n`), 'occurrence.csv');
  zip.end();
  await pipeline(zip.outputStream, createWriteStream(path));
}
