/**
 * Which rows of a batch are generalised, and how: the holder's list of sensitive taxa (a CSV with the column
 * `scientificName` and, for each taxon, one of `gridDegrees`, `gridMeters` or `distanceMeters`: see
 * src/georef/generalisation.ts; a list with only `gridDegrees`, as before, still reads), matched against
 * each row's `scientificName` after folding case and white space, and/or a column of the input that marks
 * rows (any value but empty, "0", "false" or "no" marks one), generalised one stated way. Which taxa and how
 * far is the holder's policy and local law; whereabouts only applies it.
 */
import { parse } from 'csv-parse/sync';
import { GENERALISATION_KINDS, generalisationSize, readGeneralisation, type Generalisation, type GeneralisationSettings } from '../georef/generalisation.ts';
import { termName } from '../record/term-names.ts';

/** The marking column's generalisation from stored settings, if a column is given. */
function columnGeneralisation(settings: GeneralisationSettings): Generalisation | undefined {
  if (settings.column === undefined) return undefined;
  if (settings.gridDegrees !== undefined) return { gridDegrees: settings.gridDegrees };
  if (settings.gridMeters !== undefined) return { gridMeters: settings.gridMeters };
  if (settings.distanceMeters !== undefined) return { distanceMeters: settings.distanceMeters };
  throw new Error(`the marking column "${settings.column}" needs a generalisation: gridDegrees, gridMeters or distanceMeters`);
}

/**
 * A scientific name folded for matching: Unicode NFC, lower case, runs of white space made one space, trimmed.
 * @example foldTaxonName('  Verdemaria   LINDOENSIS ') // 'verdemaria lindoensis'
 */
export function foldTaxonName(name: string): string {
  return name.normalize('NFC').toLowerCase().replace(/\s+/g, ' ').trim();
}

/**
 * The list of sensitive taxa from its CSV text: a clear error naming the line for anything unreadable.
 * @example readSensitiveTaxa('scientificName,gridDegrees,gridMeters\nVerdemaria lindoensis,0.1,\nSerenella alticola,,1000\n')
 *   // { 'verdemaria lindoensis': { gridDegrees: 0.1 }, 'serenella alticola': { gridMeters: 1000 } }
 */
export function readSensitiveTaxa(text: string, name = 'the sensitive taxa list'): Record<string, Generalisation> {
  const rows = parse(text.replace(/^\uFEFF/, ''), { skip_empty_lines: true, relax_column_count: true }) as string[][];
  const header = (rows[0] ?? []).map((h) => h.trim());
  const nameAt = header.indexOf('scientificName');
  const kindsAt = GENERALISATION_KINDS.map((kind) => [kind, header.indexOf(kind)] as const).filter(([, at]) => at >= 0);
  if (nameAt < 0 || kindsAt.length === 0) {
    throw new Error(`${name} needs the column scientificName and at least one of ${GENERALISATION_KINDS.join(', ')} (its header is: ${header.map((h) => JSON.stringify(h)).join(', ') || 'empty'})`);
  }
  const taxa: Record<string, Generalisation> = {};
  rows.slice(1).forEach((row, i) => {
    const taxon = foldTaxonName(row[nameAt] ?? '');
    if (taxon === '') throw new Error(`${name}, line ${i + 2}: no scientificName`);
    try {
      taxa[taxon] = readGeneralisation(Object.fromEntries(kindsAt.map(([kind, at]) => [kind, row[at]])));
    } catch (error) {
      throw new Error(`${name}, line ${i + 2} (${row[nameAt]}): ${(error as Error).message}`);
    }
  });
  return taxa;
}

const NOT_MARKED = new Set(['', '0', 'false', 'no']);

/**
 * For an input header, a function giving each row's generalisation (undefined: the row is not generalised).
 * Where both rules mark a row, the coarser wins (the larger cell side at the equator). An unknown marking
 * column or a list without a scientificName column in the input is an error before any row is written.
 * @example sensitiveGeneralisation(['scientificName', 'locality'], { taxa: { 'verdemaria lindoensis': { gridDegrees: 0.1 } } })(['Verdemaria lindoensis', 'x']) // { gridDegrees: 0.1 }
 */
export function sensitiveGeneralisation(header: readonly string[], settings: GeneralisationSettings): (fields: readonly string[]) => Generalisation | undefined {
  const names = header.map(termName);
  const nameAt = names.indexOf('scientificName');
  if (settings.taxa && nameAt < 0) throw new Error('a list of sensitive taxa needs a scientificName column in the input, and it has none');
  const columnAt = settings.column === undefined ? -1 : header.indexOf(settings.column);
  if (settings.column !== undefined && columnAt < 0) {
    throw new Error(`the input has no column "${settings.column}" to mark sensitive rows (its header is: ${header.map((h) => JSON.stringify(h)).join(', ')})`);
  }
  const forColumn = columnGeneralisation(settings);
  return (fields) => {
    const listed = settings.taxa ? settings.taxa[foldTaxonName(fields[nameAt] ?? '')] : undefined;
    const byTaxon = typeof listed === 'number' ? { gridDegrees: listed } : listed;
    const marked = columnAt >= 0 && !NOT_MARKED.has(foldTaxonName(fields[columnAt] ?? '')) ? forColumn : undefined;
    const both = [byTaxon, marked].filter((g): g is Generalisation => g !== undefined);
    return both.sort((a, b) => generalisationSize(b) - generalisationSize(a))[0];
  };
}
