/**
 * A Darwin Core Archive's metafile (meta.xml) as whereabouts writes it for the archive it gives back:
 * the description of each data file in the elements and attributes of the Darwin Core text guide
 * (Darwin Core Maintenance Group 2023, TDWG, http://rs.tdwg.org/dwc/terms/guides/text/, "guide §"), and
 * the description of the georeferenced core.
 */
import { appendedColumns } from './result-rows.ts';
import { DWC_NAMESPACE } from '../record/term-names.ts';
import { COORDINATE_FLAGS_COLUMN } from './csv.ts';

/** One column (or, with no index, one constant value for every row) of a data file (guide §2.4). */
export interface MetaField {
  index?: number;
  term: string;
  default?: string;
  vocabulary?: string;
}

/** A `<core>` or `<extension>` element: one data file and how to read it (guide §2.2, §2.3). */
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
  /** The `metadata` attribute of `<archive>` (guide §2.1), when given. */
  metadata?: string;
  core: MetaTable;
  extensions: MetaTable[];
}

/** The occurrence row type (guide §2.2 rowType). */
export const OCCURRENCE_ROW_TYPE = 'http://rs.tdwg.org/dwc/terms/Occurrence';

/**
 * Namespace of the columns whereabouts adds that are not Darwin Core terms themselves [CHOICE]: a
 * `proposed_<term>` column holds a proposal beside the record's own value of the term, so describing it
 * as the term would make two columns claim one term. The `.invalid` domain (RFC 2606) never resolves:
 * these are whereabouts' names, not published terms.
 */
export const PROPOSAL_NAMESPACE = 'http://whereabouts.invalid/terms/';

function escapeAttribute(value: string): string {
  return value.replace(/\\/g, '\\\\').replace(/\t/g, '\\t').replace(/\n/g, '\\n').replace(/\r/g, '\\r');
}

/** Text or an attribute value with XML's special characters escaped. */
export function xmlText(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * A metafile for an archive description, in the layout of the guide's own examples (§1.1, §3.1):
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

/**
 * The metafile of the new archive: the core as the batch writes it (UTF-8, tab, CRLF, fields enclosed
 * in '"' where needed, one header line), each original field at its index, each constant field at the
 * column it now fills (its default kept), and the appended columns after them: a Darwin Core term the
 * core did not have under its term URI, a proposal beside the core's own value and the coordinate flags
 * under PROPOSAL_NAMESPACE. Extensions are described as they were.
 */
export function describeCore(meta: MetaArchive, header: readonly string[], metadata: string): MetaArchive {
  // The terms, dataGeneralizations and informationWithheld when rows were generalised, and the coordinate flags.
  const firstAppended = appendedColumns(header).termsStart;
  const fields: MetaField[] = [];
  let constant = 0;
  const indexed = meta.core.fields.filter((f) => f.index !== undefined);
  const constants = meta.core.fields.filter((f) => f.index === undefined);
  fields.push(...indexed);
  const constantsStart = firstAppended - constants.length;
  for (const f of constants) fields.push({ ...f, index: constantsStart + constant++ });
  header.slice(firstAppended).forEach((name, k) => {
    const term = name.startsWith('proposed_') || name === COORDINATE_FLAGS_COLUMN ? PROPOSAL_NAMESPACE + name : DWC_NAMESPACE + name;
    fields.push({ index: firstAppended + k, term });
  });
  return {
    metadata,
    core: { ...meta.core, encoding: 'UTF-8', fieldsTerminatedBy: '\t', linesTerminatedBy: '\r\n', fieldsEnclosedBy: '"', ignoreHeaderLines: 1, fields },
    extensions: meta.extensions,
  };
}
