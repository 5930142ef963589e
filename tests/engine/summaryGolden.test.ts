import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { goldenSummaryText } from './summary-golden/input';

// The issued summary's model as text for every example system, written by
// `npx tsx scripts/summary-golden.ts` (committed). Exact comparison: any change to what the summary
// says about the permit, the attestation, a segment's losses, a ledger, the chart's ticks or the
// riser diagram is a failing test until the golden files are rewritten on purpose.
const examples = fileURLToPath(new URL('../../src/engine/examples/', import.meta.url));
const names = readdirSync(examples)
  .filter((f) => f.endsWith('.json'))
  .sort();

describe('golden text of the issued summary of each example system', () => {
  it('there is a golden text for every example', () => {
    expect(
      readdirSync(new URL('./summary-golden/', import.meta.url))
        .filter((f) => f.endsWith('.txt'))
        .sort(),
    ).toEqual(names.map((n) => n.replace(/\.json$/, '.txt')));
  });
  for (const name of names) {
    it(`${name}: the permit, attestation, friction per segment, every ledger, chart ticks and riser diagram are as committed`, () => {
      const golden = readFileSync(new URL(`./summary-golden/${name.replace(/\.json$/, '.txt')}`, import.meta.url), 'utf8');
      expect(goldenSummaryText(examples + name)).toBe(golden);
    });
  }
});
