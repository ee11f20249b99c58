/**
 * Former names of first-level units (states, provinces, a federal district) that labels still carry after
 * the unit was renamed: a record's stated "Distrito Federal" in Mexico is the unit gazetteers now call
 * Ciudad de México (Mexico City). Data, kept small: a name is listed only where one unit took it over whole
 * and the former name names no other unit of that country today (Brazil's "Distrito Federal" names the
 * present one, and meant Rio de Janeiro before 1960: not listed). Read only while [CHOICE formerUnitNames,
 * src/georef/method-defaults.ts] is 'on'. Pure, no I/O.
 */
import { administrativeKey } from './context.ts';

/** One renamed unit: its country (ISO 3166-1 alpha-2), the former name, the names it is known by now, and where the fact comes from. */
export interface FormerUnitName {
  countryCode: string;
  former: string;
  current: readonly string[];
  source: string;
}

export const FORMER_UNIT_NAMES: readonly FormerUnitName[] = [
  {
    countryCode: 'MX',
    former: 'Distrito Federal',
    current: ['Ciudad de México', 'Mexico City'],
    source: 'ISO 3166-2:MX, subdivision MX-DIF "Distrito Federal" in the ISO 3166/MA list before 2016, MX-CMX "Ciudad de México" in the list today, after the reform of the Mexican constitution of 2016; the dates from memory',
  },
  {
    countryCode: 'BR',
    former: 'Guanabara',
    current: ['Rio de Janeiro'],
    source: 'the state of Guanabara (1960–1975) merged into the state of Rio de Janeiro by Lei Complementar nº 20 of 1 July 1974, in force from 15 March 1975; from memory',
  },
];

/**
 * The renamed unit a stated first-level unit's former name stands for in the country, or undefined.
 * @example formerUnitName('MX', 'DISTRITO FEDERAL')?.current // ['Ciudad de México', 'Mexico City']
 * @example formerUnitName('BR', 'Distrito Federal') // undefined
 */
export function formerUnitName(countryCode: string | undefined, stated: string): FormerUnitName | undefined {
  const code = countryCode?.trim().toUpperCase();
  const key = administrativeKey(stated);
  return FORMER_UNIT_NAMES.find((unit) => unit.countryCode === code && administrativeKey(unit.former) === key);
}
