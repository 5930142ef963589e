import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { goldenOf } from './golden/goldenOf';

// Golden results of the example systems, written by `npx tsx scripts/golden.ts` (committed).
// Exact comparison: the engine is deterministic and JSON keeps every double, so any change to any
// number of the examples is a failing test until the golden files are rewritten on purpose.
const examples = new URL('../../src/engine/examples/', import.meta.url);
const names = readdirSync(examples)
  .filter((f) => f.endsWith('.json'))
  .sort();

describe('golden results of the example systems', () => {
  it('there is a golden file for every example', () => {
    expect(
      readdirSync(new URL('./golden/', import.meta.url))
        .filter((f) => f.endsWith('.json'))
        .sort(),
    ).toEqual(names);
  });
  for (const name of names) {
    it(`${name}: every verdict, margin and segment loss is as committed`, () => {
      const golden = JSON.parse(readFileSync(new URL(`./golden/${name}`, import.meta.url), 'utf8'));
      const now = JSON.parse(JSON.stringify(goldenOf(JSON.parse(readFileSync(new URL(name, examples), 'utf8')))));
      expect(now).toEqual(golden);
    });
  }
});
