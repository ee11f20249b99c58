/**
 * The metafile of a Darwin Core Archive (meta.xml), read with the saxes XML parser. Element and
 * attribute names, their defaults and the rules they follow are those of the Darwin Core text guide
 * (Darwin Core Maintenance Group 2023, TDWG, http://rs.tdwg.org/dwc/terms/guides/text/), cited by section
 * below; the description it gives is written back by src/output/darwin-core-archive.ts.
 */
import { SaxesParser, type SaxesTagNS } from 'saxes';
import type { MetaArchive, MetaTable } from '../../output/darwin-core-archive.ts';

/**
 * Read a metafile. Defaults follow §2.2: fieldsTerminatedBy ",", linesTerminatedBy "\n",
 * fieldsEnclosedBy '"', encoding UTF-8, ignoreHeaderLines 0. Escapes written as text (`\t`, `\n`,
 * `\r`), as metafiles in use write them, are read as the characters they name.
 * @example parseMetaXml('<archive xmlns="http://rs.tdwg.org/dwc/text/"><core rowType="…Occurrence">…</core></archive>').core.rowType
 */
export function parseMetaXml(text: string): MetaArchive {
  const parser = new SaxesParser({ xmlns: true, position: false });
  let metadata: string | undefined;
  let core: MetaTable | undefined;
  const extensions: MetaTable[] = [];
  let table: MetaTable | undefined;
  let inLocation = false;
  let location = '';
  const attributes = (tag: SaxesTagNS) => Object.fromEntries(Object.values(tag.attributes).map((a) => [a.local, a.value]));
  parser.on('opentag', (tag) => {
    const name = tag.local.toLowerCase();
    const a = attributes(tag);
    if (name === 'archive') metadata = a.metadata || undefined;
    else if (name === 'core' || name === 'extension') {
      table = tableOf(a, name);
      if (name === 'core') {
        if (core) throw new Error('meta.xml has more than one <core> element (the text guide §2.1 allows exactly one)');
        core = table;
      } else extensions.push(table);
    } else if (!table) return;
    else if (name === 'location') {
      inLocation = true;
      location = '';
    } else if (name === 'id' || name === 'coreid') table.idIndex = indexOf(a.index, `<${tag.local}>`);
    else if (name === 'field') {
      if (!a.term) throw new Error(`meta.xml: a <field> of ${table.locations[0] ?? 'the ' + (table === core ? 'core' : 'extension')} has no term attribute (the text guide §2.4 requires one)`);
      table.fields.push({
        term: a.term,
        ...(a.index !== undefined && a.index !== '' ? { index: indexOf(a.index, `<field term="${a.term}">`) } : {}),
        ...(a.default !== undefined ? { default: a.default } : {}),
        ...(a.vocabulary !== undefined ? { vocabulary: a.vocabulary } : {}),
      });
    }
  });
  parser.on('text', (t) => {
    if (inLocation) location += t;
  });
  parser.on('cdata', (t) => {
    if (inLocation) location += t;
  });
  parser.on('closetag', (tag) => {
    const name = tag.local.toLowerCase();
    if (name === 'location' && table) {
      inLocation = false;
      if (location.trim()) table.locations.push(location.trim());
    } else if (name === 'core' || name === 'extension') table = undefined;
  });
  try {
    parser.write(text).close();
  } catch (error) {
    throw new Error(`meta.xml is not well-formed XML: ${error instanceof Error ? error.message : String(error)}`);
  }
  if (!core) throw new Error('meta.xml has no <core> element (the text guide §2.1 requires exactly one)');
  for (const t of [core, ...extensions]) {
    if (t.locations.length === 0) throw new Error(`meta.xml: a <${t === core ? 'core' : 'extension'}> element names no file (<files><location>, the text guide §2.3)`);
  }
  return { metadata, core, extensions };
}

function tableOf(a: Record<string, string>, element: string): MetaTable {
  if (!a.rowType) throw new Error(`meta.xml: the <${element}> element has no rowType (the text guide §2.2 requires one)`);
  return {
    rowType: a.rowType,
    locations: [],
    fieldsTerminatedBy: unescape(a.fieldsTerminatedBy ?? ','),
    linesTerminatedBy: unescape(a.linesTerminatedBy ?? '\\n'),
    fieldsEnclosedBy: unescape(a.fieldsEnclosedBy ?? '"'),
    encoding: a.encoding || 'UTF-8',
    ignoreHeaderLines: a.ignoreHeaderLines ? indexOf(a.ignoreHeaderLines, `<${element} ignoreHeaderLines>`) : 0,
    ...(a.dateFormat ? { dateFormat: a.dateFormat } : {}),
    fields: [],
  };
}

function indexOf(value: string | undefined, where: string): number {
  const n = Number(value);
  if (value === undefined || value.trim() === '' || !Number.isInteger(n) || n < 0) throw new Error(`meta.xml: ${where} has index "${value ?? ''}", which is not a whole number of at least 0`);
  return n;
}

const ESCAPES: Record<string, string> = { t: '\t', n: '\n', r: '\r', '\\': '\\' };

function unescape(value: string): string {
  return value.replace(/\\([tnr\\])/g, (_, c: string) => ESCAPES[c]);
}
