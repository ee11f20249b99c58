import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseLocality } from '../../src/parse/index.ts';

// Clause splitting and the choice of the most specific clause (Chapman & Wieczorek 2020, §Georeferencing
// Workflow – Localities; method §2). Expected readings side by side in clauses.json.
const fixture: {
  cases: Array<{
    text: string;
    clauses: Array<[string, string]>;
    chosenClause: number | null;
    type: string;
    administrative: object;
    elevation?: object;
    unit?: object;
    featureKind?: string;
    otherClauses?: object[];
  }>;
} = JSON.parse(readFileSync(new URL('../fixtures/parse/clauses.json', import.meta.url), 'utf8'));

describe('clauses', () => {
  for (const c of fixture.cases) {
    it(c.text, () => {
      const r = parseLocality(c.text);
      expect(r.clauses.map((clause) => [clause.text, clause.kind])).toEqual(c.clauses);
      for (const clause of r.clauses) expect(c.text.slice(clause.start, clause.end)).toBe(clause.text);
      expect(r.chosenClause).toBe(c.chosenClause);
      expect(r.type).toBe(c.type);
      expect(r.administrative).toEqual(c.administrative);
      if (c.elevation) expect(r.elevation).toEqual(c.elevation);
      expect(r.unit).toEqual(c.unit);
      if ('featureKind' in c) expect(r.featureKind).toEqual(c.featureKind);
      expect(r.otherClauses).toEqual(c.otherClauses ?? r.otherClauses);
    });
  }
});
