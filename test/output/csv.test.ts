/**
 * CSV as src/output writes it, checked against RFC 4180 (Shafranovich 2005): §2.6 fields holding
 * commas, quotes or line breaks are enclosed in double quotes; §2.7 a quote inside is doubled; §2.1 lines
 * end with CR LF (the page's download) — the batch keeps the input's line end, written by its writer.
 */
import { describe, expect, it } from 'vitest';
import { appendedColumnNames, csvLine, outputHeader, readFlags, recordCsv } from '../../src/output/csv.ts';

describe('src/output/csv', () => {
  it('writes one record as a quoted header and row with CR LF line ends (RFC 4180 §2.1, §2.5, §2.7)', () => {
    const input = { decimalLatitude: '-45.5', georeferenceRemarks: 'taken as "Alba"; 2 km', footprintWKT: '' };
    const expected = '"locality","decimalLatitude","georeferenceRemarks","footprintWKT"\r\n"5 km N of Alba, road","-45.5","taken as ""Alba""; 2 km",""\r\n';
    expect(recordCsv('5 km N of Alba, road', input)).toBe(expected);
  });

  it('quotes a batch field only when it must (RFC 4180 §2.6), with the delimiter of the input', () => {
    expect(csvLine(['a', 'b,c', 'd"e', 'f\ng'], ',')).toBe('a,"b,c","d""e","f\ng"');
    expect(csvLine(['a', 'b;c', 'b,c'], ';')).toBe('a;"b;c";b,c');
  });

  it('appends the Darwin Core columns, prefixing those the input has, and the flags column last', () => {
    const header = outputHeader(['occurrenceID', 'locality', 'decimalLatitude']);
    expect(header.slice(0, 4)).toEqual(['occurrenceID', 'locality', 'decimalLatitude', 'proposed_decimalLatitude']);
    expect(header.at(-1)).toBe('whereabouts_coordinateFlags');
    expect(appendedColumnNames(['locality'])[0]).toBe('decimalLatitude');
  });

  it('reads the flags column back into its flags', () => {
    expect(readFlags('outside-locality-circle | fits-if-latitude-sign-flipped')).toEqual(['outside-locality-circle', 'fits-if-latitude-sign-flipped']);
    expect(readFlags('')).toEqual([]);
  });
});
