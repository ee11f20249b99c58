/**
 * What the text says a place is against what the gazetteer says it found: "Fazenda São Borja" names a
 * farm, and the town of São Borja, hundreds of kilometres away, is not it. Pure.
 */
import type { Feature } from '../match/types.ts';
import type { FeatureKind } from '../parse/types.ts';

/** Gazetteer feature types that are settlements, the ones a generic word of another kind rules out. */
const SETTLEMENTS = new Set(['city', 'town', 'village', 'hamlet']);

const KIND_WORDS: Readonly<Record<FeatureKind, string>> = {
  'populated-place': 'a populated place',
  water: 'a lake or other water',
  stream: 'a river or stream',
  mountain: 'a mountain or hill',
  farm: 'a farm or estate',
  road: 'a road or trail',
  'protected-area': 'a park or reserve',
  locality: 'a locality',
};

/**
 * Why `feature` cannot be the place the text names, or null: the text's generic word says the place is
 * a farm, water, a stream, a mountain, a road or a park, and the gazetteer's feature is a settlement.
 * @example kindMismatch('farm', 'Fazenda São Borja', saoBorjaTown)
 *   // '"Fazenda São Borja" names a farm or estate; the gazetteer's "São Borja" (town) is not it …'
 */
export function kindMismatch(kind: FeatureKind | undefined, written: string, feature: Feature): string | null {
  if (!kind || kind === 'populated-place' || kind === 'locality') return null;
  if (!SETTLEMENTS.has(feature.featureType ?? '')) return null;
  return `"${written}" names ${KIND_WORDS[kind]}; the gazetteer's "${feature.name}" (${feature.featureType}, ${feature.sourceId}:${feature.featureId}) is a settlement that shares the name, not that place, so no georeference is given`;
}
