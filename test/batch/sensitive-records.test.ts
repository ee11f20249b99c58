/**
 * The holder's list of sensitive taxa and the marking column: inputs and the rows they pick, side by side.
 * Folding (case and white space) is our documented rule (README, "Sensitive localities generalised on request").
 */
import { describe, expect, it } from 'vitest';
import { foldTaxonName, readSensitiveTaxa, sensitiveGrid } from '../../src/batch/sensitive-records.ts';

describe('sensitive taxa list', () => {
  it('reads names folded and grids in degrees', () => {
    expect(readSensitiveTaxa('\uFEFFscientificName,gridDegrees\n" Verdemaria  LINDOENSIS ",0.1\nTelmoa ambigua,0.01\n')).toEqual({ 'verdemaria lindoensis': 0.1, 'telmoa ambigua': 0.01 });
    expect(foldTaxonName('Telmoa\tAmbigua')).toBe('telmoa ambigua');
  });

  it('names the line of a bad grid or a missing name, and a header without the columns', () => {
    expect(() => readSensitiveTaxa('scientificName,gridDegrees\nTelmoa ambigua,0\n', 'taxa.csv')).toThrow(/taxa\.csv, line 2 \(Telmoa ambigua\): a generalisation grid/);
    expect(() => readSensitiveTaxa('scientificName,gridDegrees\n,0.1\n', 'taxa.csv')).toThrow(/taxa\.csv, line 2: no scientificName/);
    expect(() => readSensitiveTaxa('name,gridMeters\nTelmoa ambigua,1000\n')).toThrow(/needs the columns scientificName and gridDegrees/);
  });
});

describe('rows picked', () => {
  const header = ['scientificName', 'locality', 'withhold'];
  const pick = sensitiveGrid(header, { taxa: { 'telmoa ambigua': 0.01 }, column: 'withhold', gridDegrees: 0.1 });
  const cases: [string[], number | undefined][] = [
    [['Telmoa  ambigua', 'x', ''], 0.01],
    [['Aubracia marina', 'x', 'yes'], 0.1],
    [['Telmoa ambigua', 'x', '1'], 0.1], // both rules: the coarser grid
    [['Aubracia marina', 'x', 'No'], undefined],
    [['Aubracia marina', 'x', '0'], undefined],
    [['Telmoa ambigua var. minor', 'x', ''], undefined], // exact after folding only
  ];
  for (const [row, grid] of cases) it(`${row.join(' / ')} → ${grid}`, () => expect(pick(row)).toBe(grid));

  it('refuses a marking column the input lacks, and a list when the input has no scientificName', () => {
    expect(() => sensitiveGrid(['locality'], { column: 'withhold', gridDegrees: 0.1 })).toThrow(/no column "withhold"/);
    expect(() => sensitiveGrid(['locality'], { taxa: {} })).toThrow(/needs a scientificName column/);
  });
});
