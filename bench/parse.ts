/**
 * Parser speed on one core: the four-language fixture corpus repeated, in strings per second
 * (target ≥ 20,000/s, issue 4), plus the slowest adversarial 10,000-character input.
 * Prints the machine's load before and after. Run: npm run bench:parse
 */
import { readFileSync } from 'node:fs';
import { parseLocality } from '../src/parse/index.ts';
import { machineLoad } from './machine-load.ts';

const fixtures = new URL('../test/fixtures/parse/', import.meta.url);
const texts = ['en', 'es', 'pt', 'fr'].flatMap((language) =>
  (JSON.parse(readFileSync(new URL(`corpus-${language}.input.json`, fixtures), 'utf8')) as Array<{ text: string }>).map((e) => e.text),
);

function run(rounds: number): number {
  let types = 0;
  for (let r = 0; r < rounds; r++) for (const text of texts) types += parseLocality(text).type.length;
  return types;
}

console.log(`load at start: ${machineLoad()}`);
run(20); // warm-up
const rounds = 200;
const start = process.hrtime.bigint();
run(rounds);
const seconds = Number(process.hrtime.bigint() - start) / 1e9;
const perSecond = (rounds * texts.length) / seconds;
console.log(`parse: ${texts.length} corpus strings × ${rounds} rounds in ${seconds.toFixed(2)} s = ${Math.round(perSecond)} strings/s on one core (target ≥ 20000)`);

let worst = { piece: '', ms: 0 };
for (const piece of ['1 ', 'N ', 'de ', '°', '10 km N of X ', 'X, ', "12°30'", 'on road ', 'along ', 'between a ', 'Lat ', 'Lat. x ', '5 km N of X in y ']) {
  const text = piece.repeat(Math.ceil(10000 / piece.length)).slice(0, 10000);
  const t = process.hrtime.bigint();
  parseLocality(text);
  const ms = Number(process.hrtime.bigint() - t) / 1e6;
  if (ms > worst.ms) worst = { piece, ms };
}
console.log(`parse: slowest adversarial 10000-character input ${JSON.stringify(worst.piece)} repeated: ${worst.ms.toFixed(1)} ms`);
console.log(`load at the end: ${machineLoad()}`);
