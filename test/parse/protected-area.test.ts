/**
 * The name a protected area bears after its lead and the words saying which kind of area it is, and whether
 * "of" joins it ([CHOICE protectedAreaTown] lets the town of that name stand in for an area the gazetteer
 * lacks). Invented names; the leads and qualifiers are common label practice in the four languages, no source.
 */
import { describe, expect, it } from 'vitest';
import { protectedAreaNamesake } from '../../src/parse/index.ts';

describe('protectedAreaNamesake', () => {
  it.each([
    ['Reserva Biológica de Alisos', { name: 'Alisos', of: true }],
    ['Parque Nacional do Vila Serena', { name: 'Vila Serena', of: true }],
    ['Reserva Nac. Estricta San Aurelio', { name: 'San Aurelio', of: false }],
    ['Reserva de la Biosfera Poniente', { name: 'Poniente', of: false }],
    ['Reserva Florestal e Indígena Verdemar', { name: 'Verdemar', of: false }],
    ['P. N. Puerto Lindo', { name: 'Puerto Lindo', of: false }],
    ['P.N. Puerto Lindo', { name: 'Puerto Lindo', of: false }],
    ['Zona Protectora Las Tablas', { name: 'Las Tablas', of: false }],
    ['Verdemar National Park', { name: 'Verdemar', of: false }],
    ['Alisos State Park', { name: 'Alisos', of: false }],
    ['Parc national de la Gaspésie', { name: 'la Gaspésie', of: true }],
    ['Réserve faunique des Laurentides', { name: 'Laurentides', of: false }],
    ['Parque Estadual das Fontes', { name: 'Fontes', of: false }],
  ])('reads "%s"', (name, expected) => {
    expect(protectedAreaNamesake(name)).toEqual(expected);
  });

  it.each(['Fazenda Boa Vista', 'Parque Nacional', 'Reserva', 'Cerro Alto'])('finds no area named after a place in "%s"', (name) => {
    expect(protectedAreaNamesake(name)).toBeUndefined();
  });
});
