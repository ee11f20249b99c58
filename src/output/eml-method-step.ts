/**
 * A method step added to an archive's EML metadata, every other byte of the document kept as it was:
 * the step is inserted where the EML schema puts it (Ecological Metadata Language 2.2.0, eml-dataset:
 * `methods` after `pubPlace` and before `project` and the entities; eml-methods: `methodStep` before
 * `sampling` and `qualityControl`), found with the saxes XML parser.
 */
import iconv from 'iconv-lite';
import { SaxesParser } from 'saxes';
import type { GeneralisationSettings } from '../georef/generalisation.ts';
import type { Source } from '../match/types.ts';
import { xmlText } from './darwin-core-archive.ts';

/** Children of `dataset` that come after `methods` in the EML 2.2.0 schema. */
const AFTER_METHODS = new Set(['project', 'dataTable', 'spatialRaster', 'spatialVector', 'storedProcedure', 'view', 'otherEntity', 'referencePublication', 'usageCitation', 'literatureCited', 'annotation']);
/** Children of `methods` that come after the method steps. */
const AFTER_STEPS = new Set(['sampling', 'qualityControl']);

/**
 * The EML document with one more method step whose description is `paragraphs` (one `<para>` each).
 * The document's declared encoding (UTF-8 when none) is kept, and so is a byte order mark.
 * @example withMethodStep(readFileSync('eml.xml'), ['Georeferenced by whereabouts 0.1.0 …']).toString()
 */
export function withMethodStep(eml: Buffer, paragraphs: string[]): Buffer {
  const bom = eml[0] === 0xef && eml[1] === 0xbb && eml[2] === 0xbf ? 3 : 0;
  const encoding = declaredEncoding(eml.subarray(bom, bom + 200).toString('latin1'));
  if (!iconv.encodingExists(encoding)) throw new Error(`eml.xml declares the encoding "${encoding}", which whereabouts cannot read`);
  const text = iconv.decode(eml.subarray(bom), encoding);
  const step = `<methodStep><description>${paragraphs.map((p) => `<para>${xmlText(p)}</para>`).join('')}</description></methodStep>`;
  const { at, remove = 0, insert } = insertionPoint(text, step);
  const before = iconv.encode(text.slice(0, at), encoding).length + bom;
  const after = before + iconv.encode(text.slice(at, at + remove), encoding).length;
  return Buffer.concat([eml.subarray(0, before), iconv.encode(insert, encoding), eml.subarray(after)]);
}

/**
 * A minimal EML document holding only the method step, for an archive that has no metadata.
 * @example minimalEml('Records of occurrence.txt', ['Georeferenced by whereabouts 0.1.0 …'])
 */
export function minimalEml(title: string, paragraphs: string[]): Buffer {
  const document = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<eml:eml xmlns:eml="https://eml.ecoinformatics.org/eml-2.2.0" packageId="whereabouts-georeference" system="whereabouts">',
    `<dataset><title>${xmlText(title)}</title><methods></methods></dataset>`,
    '</eml:eml>',
    '',
  ].join('\n');
  return withMethodStep(Buffer.from(document, 'utf8'), paragraphs);
}

function declaredEncoding(head: string): string {
  return /^<\?xml[^>]*\bencoding\s*=\s*["']([A-Za-z0-9._-]+)["']/.exec(head)?.[1] ?? 'utf-8';
}

/** Where the step goes (a character offset), how many characters it replaces, and what goes there. */
interface Insertion {
  at: number;
  remove?: number;
  insert: string;
}

function insertionPoint(text: string, step: string): Insertion {
  const parser = new SaxesParser({ xmlns: true });
  const stack: string[] = [];
  let found: Insertion | undefined;
  parser.on('opentag', (tag) => {
    const parent = stack[stack.length - 1];
    const start = text.lastIndexOf('<', parser.position - 1);
    if (!found && parent === 'dataset' && AFTER_METHODS.has(tag.local)) found = { at: start, insert: `<methods>${step}</methods>` };
    if (!found && parent === 'methods' && stack[stack.length - 2] === 'dataset' && AFTER_STEPS.has(tag.local)) found = { at: start, insert: step };
    if (!tag.isSelfClosing) stack.push(tag.local);
    else if (!found && tag.local === 'methods' && parent === 'dataset') {
      // <methods/> written empty: replaced by a full element holding the step (EML allows one methods).
      found = { at: start, remove: parser.position - start, insert: `<methods>${step}</methods>` };
    }
  });
  parser.on('closetag', (tag) => {
    if (tag.isSelfClosing) return;
    stack.pop();
    const parent = stack[stack.length - 1];
    const start = text.lastIndexOf('</', parser.position - 1);
    if (!found && tag.local === 'methods' && parent === 'dataset') found = { at: start, insert: step };
    if (!found && tag.local === 'dataset') found = { at: start, insert: `<methods>${step}</methods>` };
  });
  try {
    parser.write(text).close();
  } catch (error) {
    throw new Error(`eml.xml is not well-formed XML: ${error instanceof Error ? error.message : String(error)}`);
  }
  if (!found) throw new Error('eml.xml has no <dataset> element, so it has no place for a method step (EML 2.2.0 eml-dataset)');
  return found;
}

/**
 * The words of the method step: who proposed the georeferences, with which version and method, when,
 * for how many rows, from which gazetteer sources (citation, licence, sha256), and the caution every
 * georeference carries.
 * @example methodStepParagraphs({ version: '0.1.0', runTimestamp: '2026-12-01T12:00:00Z', rows: 52, sources })[1] // 'Gazetteer sources: …, sha256 9f…'
 */
export function methodStepParagraphs(run: { version: string; runTimestamp: string; rows: number; sources: Source[]; generalise?: GeneralisationSettings }): string[] {
  const sources = run.sources.map((s) => `${s.citation}${s.licence ? ` (${s.licence})` : ''}, sha256 ${s.contentHash}`);
  return [
    `Georeferences proposed by whereabouts ${run.version} on ${run.runTimestamp} by the point-radius method (Wieczorek, Guo & Hijmans 2004; Chapman & Wieczorek 2020, Georeferencing Best Practices) for the ${run.rows} rows of the occurrence core; each row's georeferenceVerificationStatus and georeferenceRemarks say how it came out. Where a record already had a term, its value is unchanged and the proposal is in the column proposed_<term>.`,
    `Gazetteer sources: ${sources.join('; ') || 'none'}.`,
    ...(run.generalise ? [generalisationParagraph(run.generalise)] : []),
    "A georeference is an estimate, to be verified by a person; precise localities of sensitive taxa may need generalising under the holder's policy and local law.",
  ];
}

/**
 * What a job that generalised sensitive rows says of it in the method step: which rows (by a list of taxa,
 * by a marking column) and that the precise georeferences stayed out of the shared archive; each row's
 * dataGeneralizations says how its own point was generalised.
 * @example generalisationParagraph({ column: 'sensitive', gridMeters: 1000 })
 */
function generalisationParagraph(settings: GeneralisationSettings): string {
  const taxa = Object.keys(settings.taxa ?? {}).length;
  const which = [
    ...(taxa ? [`records of the ${taxa} ${taxa === 1 ? 'taxon' : 'taxa'} on the holder's list of sensitive taxa`] : []),
    ...(settings.column !== undefined ? [`records marked in the column ${settings.column}`] : []),
  ].join(' and ');
  return `The localities of ${which} were generalised as the holder asked, following its policy and local law (which whereabouts does not decide): each such row's dataGeneralizations and informationWithheld say how; the precise georeferences are not in this archive and are kept only in the private job store of whoever ran whereabouts.`;
}
