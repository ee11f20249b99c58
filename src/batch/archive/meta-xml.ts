/**
 * The metafile of a Darwin Core Archive (meta.xml), read with the saxes XML parser and written back.
 * Element and attribute names, their defaults and the rules they follow are those of the Darwin Core
 * text guide (Darwin Core Maintenance Group 2023, TDWG, http://rs.tdwg.org/dwc/terms/guides/text/), cited
 * by section below.
 */
import { SaxesParser, type SaxesTagNS } from 'saxes';

/** One column (or, with no index, one constant value for every row) of a data file (§2.4). */
export interface MetaField {
  index?: number;
  term: string;
  default?: string;
  vocabulary?: string;
}

/** A `<core>` or `<extension>` element: one data file and how to read it (§2.2, §2.3). */
export interface MetaTable {
  rowType: string;
  /** File paths relative to the metafile (`<files><location>`). */
  locations: string[];
  /** Delimiters as characters (the metafile's `\t` already turned into a tab). */
  fieldsTerminatedBy: string;
  linesTerminatedBy: string;
  /** '' when fields are not enclosed. */
  fieldsEnclosedBy: string;
  encoding: string;
  ignoreHeaderLines: number;
  dateFormat?: string;
  /** Column of the record's identifier: `<id>` in the core, `<coreid>` in an extension. */
  idIndex?: number;
  fields: MetaField[];
}

export interface MetaArchive {
  /** The `metadata` attribute of `<archive>` (§2.1), when given. */
  metadata?: string;
  core: MetaTable;
  extensions: MetaTable[];
}

/** The occurrence row type (§2.2 rowType). */
export const OCCURRENCE_ROW_TYPE = 'http://rs.tdwg.org/dwc/terms/Occurrence';

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

function escapeAttribute(value: string): string {
  return value.replace(/\\/g, '\\\\').replace(/\t/g, '\\t').replace(/\n/g, '\\n').replace(/\r/g, '\\r');
}

/** Text or an attribute value with XML's special characters escaped. */
export function xmlText(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * A metafile for an archive description, in the layout of the text guide's own examples (§1.1, §3.1):
 * delimiters written as `\t`, `\n`, `\r` escapes.
 * @example formatMetaXml({ core: { rowType: OCCURRENCE_ROW_TYPE, locations: ['occurrence.txt'], … }, extensions: [] })
 */
export function formatMetaXml(archive: MetaArchive): string {
  const table = (element: 'core' | 'extension', t: MetaTable) => {
    const attrs = [
      ['encoding', t.encoding],
      ['fieldsTerminatedBy', escapeAttribute(t.fieldsTerminatedBy)],
      ['linesTerminatedBy', escapeAttribute(t.linesTerminatedBy)],
      ['fieldsEnclosedBy', escapeAttribute(t.fieldsEnclosedBy)],
      ['ignoreHeaderLines', String(t.ignoreHeaderLines)],
      ['rowType', t.rowType],
      ...(t.dateFormat ? [['dateFormat', t.dateFormat]] : []),
    ].map(([k, v]) => `${k}="${xmlText(v)}"`).join(' ');
    const id = t.idIndex === undefined ? [] : [`    <${element === 'core' ? 'id' : 'coreid'} index="${t.idIndex}"/>`];
    const fields = t.fields.map((f) => {
      const parts = [
        ...(f.index !== undefined ? [`index="${f.index}"`] : []),
        `term="${xmlText(f.term)}"`,
        ...(f.default !== undefined ? [`default="${xmlText(f.default)}"`] : []),
        ...(f.vocabulary !== undefined ? [`vocabulary="${xmlText(f.vocabulary)}"`] : []),
      ];
      return `    <field ${parts.join(' ')}/>`;
    });
    return [
      `  <${element} ${attrs}>`,
      '    <files>',
      ...t.locations.map((l) => `      <location>${xmlText(l)}</location>`),
      '    </files>',
      ...id,
      ...fields,
      `  </${element}>`,
    ].join('\n');
  };
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<archive xmlns="http://rs.tdwg.org/dwc/text/"${archive.metadata ? ` metadata="${xmlText(archive.metadata)}"` : ''}>`,
    table('core', archive.core),
    ...archive.extensions.map((e) => table('extension', e)),
    '</archive>',
    '',
  ].join('\n');
}
