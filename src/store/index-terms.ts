/**
 * What the store indexes a feature by: the folded keys of its names and of their variants (the names
 * table) and the words of those keys (the token index and its postings). Pure, so that an import can
 * work it out on its reading thread while the store writes.
 */
import { nameVariants } from '../match/fold.ts';

export interface IndexTerms {
  /** Distinct folded keys, in the order first met. */
  keys: string[];
  /** Distinct words of the keys, in the order first met. */
  tokens: string[];
  /** The deletion keys (`storedTokenKeys`) of some of the words, when worked out already. */
  deletionKeys?: ReadonlyMap<string, Iterable<number>>;
}

/**
 * The keys and words of a feature's name and alternate names.
 * @example indexTerms('Sta. Rita', []) // { keys: ['sta rita', 'santa rita'], tokens: ['sta', 'rita', 'santa'] }
 */
export function indexTerms(name: string, alternateNames: readonly string[]): IndexTerms {
  const keys = new Set<string>();
  for (const variant of nameVariants(name)) if (variant.key !== '') keys.add(variant.key);
  for (const written of alternateNames) for (const variant of nameVariants(written)) if (variant.key !== '') keys.add(variant.key);
  const tokens = new Set<string>();
  for (const key of keys) for (const token of key.split(' ')) tokens.add(token);
  return { keys: [...keys], tokens: [...tokens] };
}
