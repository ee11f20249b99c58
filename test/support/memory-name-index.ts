/**
 * A NameIndex held in memory for matcher tests over small invented gazetteers, indexed the way the
 * SQLite store indexes an import (every reading of every name, its words, their deletion keys), with
 * a count of the rows each question read: the tests bound a lookup's work by what it asked for.
 * @example const index = memoryNameIndex([{ ...feature, name: 'Alba' }]); new CandidateMatcher(index).lookup({ name: 'Alba', context: {} })
 */
import { storedTokenKeys } from '../../src/match/edit-distance.ts';
import { nameVariants } from '../../src/match/fold.ts';
import type { Feature, NameIndex, Posting } from '../../src/match/types.ts';

/** Rows read so far by each question of the index. */
export type RowsRead = Record<'features' | 'postings' | 'names' | 'deletionKeys', number>;

export function memoryNameIndex(features: readonly Feature[]): NameIndex & { rowsRead: RowsRead } {
  const byName = new Map<string, number[]>();
  const tokens = new Map<string, { id: number; df: number; features: number[] }>();
  const byKey = new Map<number, Set<number>>();
  const words: string[] = [];
  features.forEach((feature, id) => {
    const keys = new Set([feature.name, ...feature.alternateNames].flatMap((written) => nameVariants(written).map((variant) => variant.key)));
    const featureWords = new Set<string>();
    for (const key of keys) {
      byName.set(key, [...(byName.get(key) ?? []), id]);
      for (const word of key.split(' ')) featureWords.add(word);
    }
    for (const word of featureWords) {
      let token = tokens.get(word);
      if (token === undefined) {
        token = { id: words.push(word) - 1, df: 0, features: [] };
        tokens.set(word, token);
        for (const hash of storedTokenKeys(word)) byKey.set(hash, (byKey.get(hash) ?? new Set()).add(token.id));
      }
      token.df++;
      token.features.push(id);
    }
  });
  const postingsOf = (id: number) => tokens.get(words[id])!.features;
  const rowsRead: RowsRead = { features: 0, postings: 0, names: 0, deletionKeys: 0 };
  const inCountries = (countries: readonly string[] | null) => (feature: number) =>
    countries === null || features[feature].countryCode === null || countries.includes(features[feature].countryCode!);
  return {
    rowsRead,
    version: () => 0,
    featureIdsByName: (key, limit) => (byName.get(key) ?? []).slice(0, limit),
    feature: (id) => features[id] ?? null,
    features: (ids) => {
      rowsRead.features += ids.length;
      return new Map(ids.filter((id) => features[id] !== undefined).map((id) => [id, features[id]]));
    },
    namesOf: (ids) => {
      rowsRead.names += ids.length;
      return ids.map((id) => ({ id, names: [features[id].name, ...features[id].alternateNames] }));
    },
    token: (word) => {
      const token = tokens.get(word);
      return token === undefined ? undefined : { id: token.id, df: token.df };
    },
    tokensByDeletionKeys: (keys) => {
      rowsRead.deletionKeys += keys.length;
      return [...new Set(keys.flatMap((key) => [...(byKey.get(key) ?? [])]))].map((id) => [id, words[id], tokens.get(words[id])!.df]);
    },
    postings: (tokenIds, countries, limit) => {
      const rows: Posting[] = tokenIds.flatMap((token) => postingsOf(token).filter(inCountries(countries)).map((feature) => ({ feature, token })));
      rowsRead.postings += Math.min(limit, rows.length);
      return rows.slice(0, limit);
    },
    postingsWithPartner: (driver, partners, countries, limit) => {
      const partnerIds = [...new Set(partners.map((partner) => partner.id))].sort((a, b) => a - b);
      const pairs = [...postingsOf(driver.id)].sort((a, b) => a - b).filter(inCountries(countries))
        .flatMap((feature) => partnerIds.filter((partner) => postingsOf(partner).includes(feature)).map((token) => ({ feature, token })))
        .slice(0, limit);
      rowsRead.postings += pairs.length;
      return pairs.flatMap((pair, i) => (i === 0 || pairs[i - 1].feature !== pair.feature ? [{ feature: pair.feature, token: driver.id }, pair] : [pair]));
    },
    postingsAmong: (tokenIds, featureIds) => {
      const rows = tokenIds.flatMap((token) => featureIds.filter((feature) => postingsOf(token).includes(feature)).map((feature) => ({ feature, token })));
      rowsRead.postings += rows.length;
      return rows;
    },
    attachGeometry: () => {},
    sourceRanks: () => new Map([...new Set(features.map((feature) => feature.sourceId))].map((source, rank) => [source, rank])),
  };
}
