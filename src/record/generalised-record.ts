/**
 * A record's appended Darwin Core fields generalised to a grid cell for a sensitive taxon, and the two terms
 * that say so (Darwin Core `dataGeneralizations`: "actions taken to make the shared data less specific or
 * complete than in its original form", and `informationWithheld`: "additional information that exists, but
 * that has not been shared in the given record"; TDWG Darwin Core term definitions, quoted from memory, as
 * are the example wordings the values follow). The precise fields come back apart, for the caller to keep in
 * its private store: nothing of them is left in the generalised fields.
 */
import { generalise, type Generalisation } from '../georef/generalisation.ts';
import type { GeoreferenceTerm } from './darwin-core.ts';

/** The Darwin Core terms a generalised output adds (TDWG Darwin Core, dwc: namespace), in output order. */
export const GENERALISATION_TERMS = ['dataGeneralizations', 'informationWithheld'] as const;
export type GeneralisationTerm = (typeof GENERALISATION_TERMS)[number];

/** The fields a generalisation replaces: what is kept precise only in the private store. */
export const WITHHELD_TERMS = ['decimalLatitude', 'decimalLongitude', 'coordinateUncertaintyInMeters', 'coordinatePrecision', 'footprintWKT', 'georeferenceSources', 'georeferenceRemarks'] as const satisfies readonly GeoreferenceTerm[];
export type WithheldTerm = (typeof WITHHELD_TERMS)[number];

export interface GeneralisedRecord {
  fields: Record<GeoreferenceTerm, string>;
  terms: Record<GeneralisationTerm, string>;
  /** The precise values replaced, for the private store only. */
  withheld: Record<WithheldTerm, string>;
}

/**
 * Generalise a georeferenced record's fields to the centre of its grid cell (a degree grid, a grid in meters,
 * or a stated distance: src/georef/generalisation.ts). The sources and remarks are withheld too, as they
 * name the feature and offsets that place the record precisely. A record with no point is returned as it
 * is, with empty terms (nothing to withhold).
 * @example
 *   generaliseRecord({ decimalLatitude: '-45.4321', decimalLongitude: '-131.0789', coordinateUncertaintyInMeters: '2000', … }, { gridDegrees: 0.1 }).fields
 *   // { decimalLatitude: '-45.45', decimalLongitude: '-131.05', coordinateUncertaintyInMeters: '8797', coordinatePrecision: '0.1', footprintWKT: 'POLYGON((-131.1 -45.5,…))', … }
 */
export function generaliseRecord(fields: Record<GeoreferenceTerm, string>, generalisation: Generalisation): GeneralisedRecord {
  const withheld = Object.fromEntries(WITHHELD_TERMS.map((t) => [t, fields[t]])) as Record<WithheldTerm, string>;
  if (fields.decimalLatitude === '' || fields.decimalLongitude === '' || fields.coordinateUncertaintyInMeters === '') {
    return { fields, terms: { dataGeneralizations: '', informationWithheld: '' }, withheld };
  }
  const cell = generalise(
    { latitude: Number(fields.decimalLatitude), longitude: Number(fields.decimalLongitude), radiusMeters: Number(fields.coordinateUncertaintyInMeters) },
    generalisation,
  );
  return {
    fields: {
      ...fields,
      decimalLatitude: cell.decimalLatitude,
      decimalLongitude: cell.decimalLongitude,
      coordinateUncertaintyInMeters: String(cell.radiusMeters),
      coordinatePrecision: cell.coordinatePrecision,
      footprintWKT: cell.footprintWKT,
      georeferenceSources: 'withheld with the precise georeference',
      georeferenceRemarks: `generalised on request for a sensitive taxon [CHOICE] (docs/method.md §8): the point is the centre of its ${cell.cell}; the radius is the cell's farthest corner from the centre (${cell.halfDiagonalMeters.toFixed(1)} m) plus the original radius, rounded up; the precise georeference, its sources and remarks are kept by the data custodian`,
    },
    terms: {
      dataGeneralizations: `Coordinates generalized from the original georeference to the centre of a ${cell.cell}; coordinateUncertaintyInMeters grown to cover the cell and the original uncertainty; footprintWKT is the cell`,
      informationWithheld: "Precise location information withheld under the holder's policy (decimalLatitude, decimalLongitude, coordinateUncertaintyInMeters, coordinatePrecision, footprintWKT, georeferenceSources, georeferenceRemarks); available from the data custodian",
    },
    withheld,
  };
}
