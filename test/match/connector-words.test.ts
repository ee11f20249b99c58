/**
 * A name read without the small words joining its parts (src/match/connector-words.ts, [CHOICE]
 * connectorReadings). The joining words are those of the four languages' grammars ("de", its contractions
 * "del", "da", "do", "dos", "das", "du", "des"; English "of"); which ones labels drop is common practice, no
 * source. Label as written beside the key it is compared by.
 */
import { describe, expect, it } from 'vitest';
import { withoutConnectors } from '../../src/match/connector-words.ts';

describe('withoutConnectors', () => {
  it.each([
    // es: the official "San Manuel de Colohete" and a label's "San Manuel Colohete" meet.
    ['san manuel de colohete', 'san manuel colohete'],
    ['san manuel colohete', 'san manuel colohete'],
    // pt: "do" and "de" swapped (Campos do Jordão, "Campos de Jordão").
    ['campos do jordao', 'campos jordao'],
    ['campos de jordao', 'campos jordao'],
    ['porto dos gauchos', 'porto gauchos'],
    // fr and en (invented): "Saint-Pierre-des-Champs", "Isle of Pines".
    ['saint pierre des champs', 'saint pierre champs'],
    ['isle of pines', 'isle pines'],
    // the article inside a name (es, invented): "Puerto de la Cruz".
    ['puerto de la cruz', 'puerto cruz'],
  ])('reads %s as %s', (folded, bare) => {
    expect(withoutConnectors(folded)).toBe(bare);
  });

  it.each(['la paz', 'rio dos', 'de', 'colohete', ''])('reads no name left with fewer than two other words: "%s"', (folded) => {
    expect(withoutConnectors(folded)).toBeNull();
  });
});
