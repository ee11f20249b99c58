import { DATUMS, datumFromName } from './datums.ts';

/**
 * Values of a datum field that state no datum: Darwin Core's own "not recorded" (geodeticDatum,
 * TDWG 2023) and the usual words for the same [CHOICE: common practice, no source].
 */
const NOT_STATED = new Set(['', 'not recorded', 'unknown', 'not stated', 'none', 'desconocido', 'no registrado', 'desconhecido', 'inconnu']);

/** How to name a datum, for every message that refuses one. */
export const HOW_TO_NAME_A_DATUM = `name a datum by its EPSG code or a known name: ${DATUMS.map((d) => `${d.epsg} (${d.name})`).join(', ')}; or "not recorded" when it is not known`;

/**
 * A datum given beside coordinates rather than written with them (the CLI's --geodetic-datum, the HTTP
 * body's geodeticDatum and options.datum, a batch's geodeticDatum column), read by one rule: blank or
 * "not recorded" states none; an EPSG code or a name of the datum table gives that datum's EPSG code;
 * anything else is refused with how to name a datum. The datum given applies to every coordinate pair
 * of the record whose datum is not written beside it.
 * @example readDatumOption('NAD 1927', '--geodetic-datum') // { epsg: 'EPSG:4267' }
 * @example readDatumOption('banana', 'geodeticDatum') // { problem: 'geodeticDatum "banana" is not a datum whereabouts knows: name a datum …' }
 */
export function readDatumOption(value: string | undefined, field: string): { epsg?: string } | { problem: string } {
  const text = value?.trim() ?? '';
  if (NOT_STATED.has(text.toLowerCase())) return {};
  const epsg = datumFromName(text);
  return epsg ? { epsg } : { problem: `${field} ${JSON.stringify(text)} is not a datum whereabouts knows: ${HOW_TO_NAME_A_DATUM}` };
}
