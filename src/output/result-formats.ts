/** The formats `batch` writes its results in (src/batch/gis-output.ts writes the GIS ones). */

export const RESULT_FORMATS = ['csv', 'geojson', 'gpkg'] as const;
export type ResultFormat = (typeof RESULT_FORMATS)[number];

/**
 * The format named by an option value, or a clear error.
 * @example resultFormat('gpkg') // 'gpkg'
 */
export function resultFormat(value: string): ResultFormat {
  const format = value.toLowerCase();
  if (!(RESULT_FORMATS as readonly string[]).includes(format)) throw new Error(`--format must be one of ${RESULT_FORMATS.join(', ')}, not '${value}'`);
  return format as ResultFormat;
}
