/**
 * A place written in an older spelling is found as a documented reading ([CHOICE] olderSpellings,
 * src/match/older-spelling.ts), only where the reform applies, within the stated units and the
 * ambiguity rules. A small invented gazetteer (demo island style, CC0) of towns of the island QV,
 * imported from CSV into a real SQLite file; the reforms are told by the text's language. The rules
 * (y for i, doubled consonants: Brazil's Formulário Ortográfico, 1943; x and j: Real Academia
 * Española, 1815) are from memory. What is checked is that such a name is not a near spelling left for
 * review (fuzzyLoneName) and that the workflow's rule of never using a feature silently holds
 * (Chapman & Wieczorek 2020, Georeferencing Best Practices, §Georeferencing Workflow – Localities, step 5).
 */
import { describe, expect, it } from 'vitest';
import { locate } from '../../src/locate/locate.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { useTownStore } from '../support/csv-store.ts';

// Invented towns: one Itacorá, Vila Nova in two states, Xocotal, and two whose final nasal a the
// gazetteer spells in the two ways (Guaracan, older; Tamburã, modern).
const ROWS = [
  ['t1', 'Itacorá', -20.0, -50.0, 'Poniente'],
  ['t2', 'Vila Nova', -20.5, -50.5, 'Poniente'],
  ['t3', 'Vila Nova', -21.5, -49.5, 'Levante'],
  ['t4', 'Xocotal', -19.0, -49.0, 'Levante'],
  ['t5', 'Guaracan', -18.0, -48.0, 'Levante'],
  ['t6', 'Tamburã', -17.0, -47.0, 'Levante'],
] as const;

const store = useTownStore('older-spelling', ROWS);

describe('a place written in an older spelling ([CHOICE] olderSpellings)', () => {
  it('is on by default', () => {
    expect(METHOD_DEFAULTS.olderSpellings).toBe('on');
  });

  it('is found as a documented reading in Portuguese text, and the remarks name the rule and its source', () => {
    const result = locate(store(), { locality: '5 km ao norte de Ytacorá', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('t1');
    expect(result.georeference!.remarks.join('\n')).toContain("'ytacora' read as an older spelling of 'itacora' ('y' for 'i'; Portuguese reform of 1911, Brazilian Formulário Ortográfico of 1943; from memory)");
  });

  it('is found in Spanish text by x for j', () => {
    const result = locate(store(), { locality: 'cerca de Jocotal', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('t4');
    expect(result.georeference!.remarks.join('\n')).toContain("'x' and 'j' for one sound; Real Academia Española, Ortografía of 1815; from memory");
  });

  it.each([
    // label as written / the town it is read as, and the rule named in the remarks
    ['8 km ao norte de Guaracã', 't5', "'guaracã' read as the modern spelling of 'guaracan' ('an' for a final 'ã'"],
    ['8 km ao norte de Tamburan', 't6', "'tamburan' read as an older spelling of 'tambura' ('an' for a final 'ã'"],
  ])('reads a final "ã" and the older "an" each as the other: %s', (locality, id, remark) => {
    const result = locate(store(), { locality, countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe(id);
    expect(result.georeference!.remarks.join('\n')).toContain(remark);
  });

  it('is not read where no reform applies (a bare name in QV): the near spelling is left for review', () => {
    const result = locate(store(), { locality: 'Ytacorá', countryCode: 'QV' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/\[CHOICE fuzzyLoneName/);
  });

  it('is not read when the choice is off', () => {
    const result = locate(store(), { locality: '5 km ao norte de Ytacorá', countryCode: 'QV', options: { olderSpellings: 'off' } });
    expect(result.georeference!.remarks.join('\n')).not.toContain('older spelling');
    expect(result.georeference!.remarks.join('\n')).toContain("1 edit from name 'Itacorá'");
  });

  it('keeps the ambiguity rules: an older spelling of a name two towns bear is ambiguous', () => {
    const result = locate(store(), { locality: '3 km ao sul de Villa Nova', countryCode: 'QV' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/matches several features/);
  });

  it('keeps the stated units: the one town of the stated state is taken', () => {
    const result = locate(store(), { locality: '3 km ao sul de Villa Nova', countryCode: 'QV', stateProvince: 'Levante' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('t3');
  });
});
