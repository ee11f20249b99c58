/**
 * Reads the WKT footprints whereabouts writes (POLYGON and MULTIPOLYGON, OGC Simple Features 1.2.1
 * §7) into GeoJSON geometry (RFC 7946) for the map. Exact: numbers are copied, not recomputed.
 */
import type { MultiPolygon, Polygon, Position } from 'geojson';

type Nested = Position | Nested[];

/**
 * Undefined for an empty string or a shape other than a polygon or multipolygon.
 * @example footprintGeometry('POLYGON ((0 0, 1 0, 1 1, 0 0))') // { type: 'Polygon', coordinates: [[[0,0],[1,0],[1,1],[0,0]]] }
 */
export function footprintGeometry(wkt: string): Polygon | MultiPolygon | undefined {
  const match = /^\s*(MULTIPOLYGON|POLYGON)\s*(\(.*\))\s*$/is.exec(wkt);
  if (!match) return undefined;
  const coordinates = readNested(match[2]);
  return match[1].toUpperCase() === 'POLYGON'
    ? { type: 'Polygon', coordinates: coordinates as Position[][] }
    : { type: 'MultiPolygon', coordinates: coordinates as Position[][][] };
}

/** "((1 2, 3 4))" → [[[1,2],[3,4]]]: parentheses nest lists; commas separate positions. */
function readNested(text: string): Nested[] {
  const stack: Nested[][] = [[]];
  for (const token of text.match(/\(|\)|,|[^(),]+/g) ?? []) {
    if (token === '(') {
      const list: Nested[] = [];
      stack[stack.length - 1].push(list);
      stack.push(list);
    } else if (token === ')') {
      stack.pop();
    } else if (token !== ',' && token.trim()) {
      stack[stack.length - 1].push(token.trim().split(/\s+/).map(Number));
    }
  }
  return stack[0][0] as Nested[];
}
