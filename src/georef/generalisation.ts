/**
 * The three ways a sensitive record's georeference can be generalised on request (docs/method.md §8), as
 * the holder's policy states them, and the one function that applies any of them:
 * - `gridDegrees`: the centre of its cell in a latitude-longitude grid (src/georef/grid-generalisation.ts);
 * - `gridMeters`: the centre of its cell in the UTM grid of its zone, cells of that side in meters
 *   (src/georef/meter-grid-generalisation.ts);
 * - `distanceMeters`, a stated distance d: the centre of its cell in that same UTM grid with cells of side
 *   d·√2, whose half-diagonal is d, so the precise point lies within d of the point shown (to 1.5 %: the
 *   grid's scale factor and the written centre's rounding), and nothing finer than that is shown
 *   [CHOICE: our reading of "a stated distance", reproducible where a random shift would not be].
 * Which taxa, and how far, are the holder's policy and local law, which whereabouts does not decide.
 */
import { generaliseToGrid, parseGridDegrees, type GridGeneralisation, type PointRadius } from './grid-generalisation.ts';
import { generaliseToMeterGrid, METER_GRID_LIMITS } from './meter-grid-generalisation.ts';

export type Generalisation = { gridDegrees: number } | { gridMeters: number } | { distanceMeters: number };

/** The names under which a generalisation is written: CSV columns of the taxa list, CLI and HTTP fields. */
export const GENERALISATION_KINDS = ['gridDegrees', 'gridMeters', 'distanceMeters'] as const;
export type GeneralisationKind = (typeof GENERALISATION_KINDS)[number];

/** The stated distances accepted, meters: the cell of side d·√2 stays within the grid's limits. */
export const DISTANCE_LIMITS = { smallest: METER_GRID_LIMITS.smallest, largest: Math.floor(METER_GRID_LIMITS.largest / Math.SQRT2) } as const;

/**
 * Generalise a point-radius georeference as asked.
 * @example generalise({ latitude: -45.4321, longitude: -131.0789, radiusMeters: 2000 }, { distanceMeters: 5000 }).cell
 *   // 'cell of the UTM zone 9S grid (WGS 84) within 5000 m of the precise point (side 7071.07 m)'
 */
export function generalise(point: PointRadius, generalisation: Generalisation): GridGeneralisation {
  if ('gridDegrees' in generalisation) return generaliseToGrid(point, generalisation.gridDegrees);
  if ('gridMeters' in generalisation) return generaliseToMeterGrid(point, generalisation.gridMeters);
  const cell = generaliseToMeterGrid(point, generalisation.distanceMeters * Math.SQRT2);
  return { ...cell, cell: `${cell.cell.replace(/^\S+ m /, '')} within ${generalisation.distanceMeters} m of the precise point (side ${(generalisation.distanceMeters * Math.SQRT2).toFixed(2)} m)` };
}

/**
 * A generalisation from its written fields (a taxa list's columns, CLI options, HTTP fields): exactly one of
 * them must be given; a clear error otherwise, naming the fields.
 * @example readGeneralisation({ gridMeters: '1000' }) // { gridMeters: 1000 }
 */
export function readGeneralisation(fields: Partial<Record<GeneralisationKind, string | undefined>>): Generalisation {
  const given = GENERALISATION_KINDS.filter((kind) => (fields[kind] ?? '').trim() !== '');
  if (given.length !== 1) {
    throw new Error(`give exactly one of gridDegrees (a grid in degrees, such as 0.1), gridMeters (a grid in meters, such as 1000) or distanceMeters (a stated distance in meters), not ${given.length === 0 ? 'none' : given.join(' and ')}`);
  }
  const kind = given[0]!;
  const text = fields[kind]!.trim();
  if (kind === 'gridDegrees') return { gridDegrees: parseGridDegrees(text) };
  const value = /^\d+(\.\d+)?$/.test(text) ? Number(text) : Number.NaN;
  const [smallest, largest] = kind === 'gridMeters' ? [METER_GRID_LIMITS.smallest, METER_GRID_LIMITS.largest] : [DISTANCE_LIMITS.smallest, DISTANCE_LIMITS.largest];
  if (!(value >= smallest && value <= largest)) {
    throw new Error(`${kind === 'gridMeters' ? 'a generalisation grid in meters' : 'a generalisation distance'} must be a number of meters from ${smallest} to ${largest}, not "${text}"`);
  }
  return kind === 'gridMeters' ? { gridMeters: value } : { distanceMeters: value };
}

/**
 * How large a generalisation is, meters at the equator, to choose the coarser of two that mark one row.
 * @example generalisationSize({ gridDegrees: 0.1 }) // 11131.9…
 */
export function generalisationSize(generalisation: Generalisation): number {
  if ('gridDegrees' in generalisation) return generalisation.gridDegrees * 111_319.49;
  return 'gridMeters' in generalisation ? generalisation.gridMeters : generalisation.distanceMeters * Math.SQRT2;
}

/**
 * What a job stores (in its settings) to pick the rows it generalises. For the marking column, the
 * generalisation's own field sits beside `column` (`{ column, gridMeters: 1000 }`), as jobs stored
 * `{ column, gridDegrees }` before grids in meters.
 */
export type GeneralisationSettings = {
  /** Folded scientific name → generalisation (a bare number is a grid in degrees, as older jobs stored it). */
  taxa?: Record<string, Generalisation | number>;
  /** The input column that marks rows to generalise. */
  column?: string;
} & Partial<{ gridDegrees: number; gridMeters: number; distanceMeters: number }>;
