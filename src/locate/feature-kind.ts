/**
 * What the text says a place is against what the gazetteer says it found: "Fazenda São Borja" names a
 * farm, and the town of São Borja, hundreds of kilometres away, is not it. Pure.
 */
import type { Feature } from '../match/types.ts';
import type { FeatureKind } from '../parse/types.ts';
import { featureKindOf } from '../parse/index.ts';

/** Gazetteer feature types that are settlements, the ones a generic word of another kind rules out. */
export const SETTLEMENTS = new Set(['city', 'town', 'village', 'hamlet']);

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
 * What the text's generic word does to a feature: nothing (null), a reason to decline with what the gazetteer
 * lacks (`missing`, the clause's place counted as not loaded), or a remark on taking it.
 */
export type KindVerdict = null | { decline: string; missing: string } | { remark: string };

/**
 * Whether `feature` can be the place the text names. The text's generic word says the place is a farm,
 * water, a stream, a mountain, a road or a park, and the gazetteer's feature is a settlement: declined
 * when the settlement's own name lacks that word (it only shares the rest of the name), and, by the
 * [CHOICE] `settlementNamedLikeFeature`, taken with a remark when the settlement's own name begins or
 * ends with a word of the same kind ("Rio de Janeiro", "Serra Grande"): a label naming a whole place
 * the gazetteer holds only as a town most often means the town.
 * @example judgeKind('farm', 'Fazenda São Borja', saoBorjaTown, 'settlement')
 *   // { decline: '"Fazenda São Borja" names a farm or estate; the gazetteer's "São Borja" (town, …) is a settlement …', missing: 'as a farm or estate' }
 * @example judgeKind('stream', 'Rio Fundo', rioFundoTown, 'settlement')
 *   // { remark: '"Rio Fundo" may name a river or stream; …taken as the town [CHOICE settlementNamedLikeFeature …]' }
 */
export function judgeKind(kind: FeatureKind | undefined, written: string, feature: Feature, rule: 'settlement' | 'decline'): KindVerdict {
  if (!kind || kind === 'populated-place' || kind === 'locality') return null;
  if (!SETTLEMENTS.has(feature.featureType ?? '')) return null;
  const described = `the gazetteer's "${feature.name}" (${feature.featureType}, ${feature.sourceId}:${feature.featureId})`;
  if (rule === 'settlement' && featureKindOf(feature.name) === kind) {
    return { remark: `"${written}" may name ${KIND_WORDS[kind]}; ${described} is a settlement of that very name and the feature found for it, so it is taken as the settlement: verify [CHOICE settlementNamedLikeFeature, src/georef/method-defaults.ts]` };
  }
  return {
    decline: `"${written}" names ${KIND_WORDS[kind]}; ${described} is a settlement that shares the name, not that place, so no georeference is given`,
    missing: `as ${KIND_WORDS[kind]}`,
  };
}
