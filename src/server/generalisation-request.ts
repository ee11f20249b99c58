/**
 * The generalisation a batch upload asks for (POST /api/v1/batches): the same choices as `whereabouts batch`
 * (--sensitive-taxa, --sensitive-column with --generalise-to, --generalise-to-meters or --generalise-within),
 * given as query fields and, for the list of taxa, a second file in the upload. Which taxa, and how far, are
 * the holder's policy and local law, which whereabouts does not decide.
 */
import { Type, type Static } from 'typebox';
import { readSensitiveTaxa } from '../batch/sensitive-records.ts';
import type { GeneralisationSettings } from '../georef/generalisation.ts';
import { DISTANCE_LIMITS, readGeneralisation } from '../georef/generalisation.ts';
import { METER_GRID_LIMITS } from '../georef/meter-grid-generalisation.ts';
import { RequestError } from './errors.ts';

/** Largest list of sensitive taxa accepted, bytes [CHOICE: tens of thousands of names; our choice, no source]. */
export const SENSITIVE_TAXA_LIMIT = 1024 * 1024;

const decimal = (description: string) => Type.String({ pattern: '^[0-9]{1,6}(\\.[0-9]{1,6})?$', description });

/** The query fields of an upload that asks for generalisation; each is optional, as without them. */
export const generalisationQuerySchema = Type.Object(
  {
    sensitiveColumn: Type.Optional(Type.String({ minLength: 1, maxLength: 200, description: 'Generalise the rows this input column marks (any value but empty, 0, false or no); needs one of gridDegrees, gridMeters or distanceMeters.' })),
    gridDegrees: Type.Optional(decimal('For sensitiveColumn: a grid in degrees, above 0 and at most 10, with at most 6 decimals (such as 0.1).')),
    gridMeters: Type.Optional(decimal(`For sensitiveColumn: a grid in meters, the UTM grid of the point's zone with cells of this side, ${METER_GRID_LIMITS.smallest} to ${METER_GRID_LIMITS.largest}.`)),
    distanceMeters: Type.Optional(decimal(`For sensitiveColumn: a stated distance in meters, ${DISTANCE_LIMITS.smallest} to ${DISTANCE_LIMITS.largest}; the precise point is kept within it of the point shown.`)),
  },
  {
    additionalProperties: false,
    dependencies: { gridDegrees: ['sensitiveColumn'], gridMeters: ['sensitiveColumn'], distanceMeters: ['sensitiveColumn'] },
    description:
      "Generalisation of sensitive rows, only on request and following the holder's policy and local law, which whereabouts does not decide. " +
      `A list of taxa goes in the upload as a second file, field "sensitiveTaxa" (CSV: scientificName and one of gridDegrees, gridMeters, distanceMeters for each taxon; at most ${SENSITIVE_TAXA_LIMIT} bytes).`,
  },
);
export type GeneralisationQuery = Static<typeof generalisationQuerySchema>;

/**
 * The job's generalisation settings from the query and the taxa file, or undefined when none is asked;
 * a 400 naming the field for anything that does not read.
 * @example generalisationRequest({ sensitiveColumn: 'withhold', gridMeters: '1000' }) // { column: 'withhold', gridMeters: 1000 }
 */
export function generalisationRequest(query: GeneralisationQuery, taxaBytes?: Buffer): GeneralisationSettings | undefined {
  let taxa: GeneralisationSettings['taxa'];
  if (taxaBytes !== undefined) {
    if (taxaBytes.length > SENSITIVE_TAXA_LIMIT) throw new RequestError(413, `the list of sensitive taxa is larger than ${SENSITIVE_TAXA_LIMIT} bytes`, 'sensitiveTaxa');
    try {
      taxa = readSensitiveTaxa(taxaBytes.toString('utf8'));
    } catch (error) {
      throw new RequestError(400, (error as Error).message, 'sensitiveTaxa');
    }
  }
  let column: GeneralisationSettings | undefined;
  if (query.sensitiveColumn !== undefined) {
    try {
      column = { column: query.sensitiveColumn, ...readGeneralisation(query) };
    } catch (error) {
      throw new RequestError(400, `sensitiveColumn: ${(error as Error).message}`, 'sensitiveColumn');
    }
  }
  if (!taxa && !column) return undefined;
  return { ...(taxa ? { taxa } : {}), ...column };
}
