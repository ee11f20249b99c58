/**
 * Which rows of a batch are generalised, and to which grid: the holder's list of sensitive taxa (a CSV with
 * the columns `scientificName` and `gridDegrees`, matched against each row's `scientificName` after
 * folding case and white space) and/or a column of the input that marks rows (any value but empty, "0",
 * "false" or "no" marks one), generalised to one stated grid. Which taxa and grids is the holder's policy
 * and local law; whereabouts only applies it.
 */
import { parse } from 'csv-parse/sync';
import { parseGridDegrees } from '../georef/grid-generalisation.ts';
import { termName } from '../record/term-names.ts';

/** What a job stores (in its settings) to pick the rows it generalises. */
export interface GeneralisationSettings {
  /** Folded scientific name → grid in degrees. */
  taxa?: Record<string, number>;
  /** The input column that marks rows to generalise, and the grid for them. */
  column?: string;
  gridDegrees?: number;
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
 * @example readSensitiveTaxa('scientificName,gridDegrees\nVerdemaria lindoensis,0.1\n') // { 'verdemaria lindoensis': 0.1 }
 */
export function readSensitiveTaxa(text: string, name = 'the sensitive taxa list'): Record<string, number> {
  const rows = parse(text.replace(/^\uFEFF/, ''), { skip_empty_lines: true, relax_column_count: true }) as string[][];
  const header = (rows[0] ?? []).map((h) => h.trim());
  const nameAt = header.indexOf('scientificName');
  const gridAt = header.indexOf('gridDegrees');
  if (nameAt < 0 || gridAt < 0) {
    throw new Error(`${name} needs the columns scientificName and gridDegrees (its header is: ${header.map((h) => JSON.stringify(h)).join(', ') || 'empty'})`);
  }
  const taxa: Record<string, number> = {};
  rows.slice(1).forEach((row, i) => {
    const taxon = foldTaxonName(row[nameAt] ?? '');
    if (taxon === '') throw new Error(`${name}, line ${i + 2}: no scientificName`);
    try {
      taxa[taxon] = parseGridDegrees(row[gridAt] ?? '');
    } catch (error) {
      throw new Error(`${name}, line ${i + 2} (${row[nameAt]}): ${(error as Error).message}`);
    }
  });
  return taxa;
}

const NOT_MARKED = new Set(['', '0', 'false', 'no']);

/**
 * For an input header, a function giving each row's grid (undefined: the row is not generalised). Where both
 * rules mark a row, the coarser grid wins. An unknown marking column or a list without a scientificName
 * column in the input is an error before any row is written.
 * @example sensitiveGrid(['scientificName', 'locality'], { taxa: { 'verdemaria lindoensis': 0.1 } })(['Verdemaria lindoensis', 'x']) // 0.1
 */
export function sensitiveGrid(header: readonly string[], settings: GeneralisationSettings): (fields: readonly string[]) => number | undefined {
  const names = header.map(termName);
  const nameAt = names.indexOf('scientificName');
  if (settings.taxa && nameAt < 0) throw new Error('a list of sensitive taxa needs a scientificName column in the input, and it has none');
  const columnAt = settings.column === undefined ? -1 : header.indexOf(settings.column);
  if (settings.column !== undefined && columnAt < 0) {
    throw new Error(`the input has no column "${settings.column}" to mark sensitive rows (its header is: ${header.map((h) => JSON.stringify(h)).join(', ')})`);
  }
  return (fields) => {
    const byTaxon = settings.taxa ? settings.taxa[foldTaxonName(fields[nameAt] ?? '')] : undefined;
    const marked = columnAt >= 0 && !NOT_MARKED.has(foldTaxonName(fields[columnAt] ?? '')) ? settings.gridDegrees : undefined;
    const grids = [byTaxon, marked].filter((g): g is number => g !== undefined);
    return grids.length === 0 ? undefined : Math.max(...grids);
  };
}
