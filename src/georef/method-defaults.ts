/**
 * Every setting of the method that the sources leave to us ([CHOICE] in docs/method.md), in one place.
 * A caller overrides any of them through MethodOptions; the remarks cite the section each comes from.
 */
export const METHOD_DEFAULTS = {
  /** Datum not stated and no regional datum applies: the global worst case, 5359 m (docs/method.md §5.4, BP2020 [DOC]). */
  unknownDatumMeters: 5359,
  /** "near X": radius r_f + max(r_f, this) (docs/method.md §3 [CHOICE]). */
  nearMinimumMeters: 1000,
  /** Own extent of a junction, confluence or crossing (docs/method.md §3 [CHOICE]). */
  junctionExtentMeters: 100,
  /** Segments of a footprint circle (WKT polygon vertices, docs/method.md §6 [CHOICE]). */
  footprintSegments: 64,
  /** Map accuracy standard when a map scale is given but no standard (docs/method.md §5.5: 1 mm only). */
  mapStandard: 'unknown',
} as const satisfies Record<string, number | string>;
