/**
 * The name a station bears after its station word ([CHOICE stationTown] lets the town of that name stand in for a
 * station the gazetteer lacks). Invented names; the station words are common label practice in the four
 * languages, no source.
 */
import { describe, expect, it } from 'vitest';
import { stationNamesake } from '../../src/parse/index.ts';

describe('stationNamesake', () => {
  it.each([
    ['Millbrook Station', 'Millbrook'],
    ['Estación San Telmo', 'San Telmo'],
    ['Estación de San Telmo', 'San Telmo'],
    ['Estação Vila Serena', 'Vila Serena'],
    ['Gare de Vaubrun', 'Vaubrun'],
  ])('reads "%s"', (name, expected) => {
    expect(stationNamesake(name)).toBe(expected);
  });

  it.each(['Alisos Biological Station', 'Estación Biológica de Alisos', 'Estación Experimental Poniente', 'Station', 'Fazenda Boa Vista', 'Estación de la sierra'])('finds no station named after a place in "%s"', (name) => {
    expect(stationNamesake(name)).toBeUndefined();
  });
});
