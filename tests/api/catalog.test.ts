import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MATERIALS } from '../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { makeUser, signedIn, startHarness, type Harness } from './support/harness';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

describe('the catalogs in PostgreSQL', () => {
  it('when a signed-in user reads the catalog, then every entry names a source and matches the engine’s catalog', async () => {
    const client = await signedIn(h, await makeUser(h.db));
    const { entries } = (await client.get('/api/catalog').expect(200)).body as { entries: { kind: string; id: string; source: string; data: unknown }[] };
    for (const e of entries) expect(e.source.trim().length, `${e.kind} ${e.id}`).toBeGreaterThan(10);
    const byKind = (k: string) => entries.filter((e) => e.kind === k);
    expect(
      byKind('material')
        .map((e) => e.id)
        .sort(),
    ).toEqual(Object.keys(MATERIALS).sort());
    expect(
      byKind('fitting-type')
        .map((e) => e.id)
        .sort(),
    ).toEqual(Object.keys(FITTING_TYPES).sort());
    expect(
      byKind('fixture-type')
        .map((e) => e.id)
        .sort(),
    ).toEqual(Object.keys(FIXTURE_TYPES).sort());
    const copperL = byKind('material').find((e) => e.id === 'copper-l')!.data;
    expect(copperL).toEqual(JSON.parse(JSON.stringify(MATERIALS['copper-l'])));
    // a fitting published at one size only keeps its per-size K through the database (NIST push-fit coupling)
    const pushCoupling = byKind('fitting-type').find((e) => e.id === 'push-brass-coupling')!;
    expect(pushCoupling.data).toEqual(JSON.parse(JSON.stringify(FITTING_TYPES['push-brass-coupling'])));
    expect(pushCoupling.source).toContain('Push-to-Connect Elbows and Couplings');
    expect(byKind('device-template').length).toBeGreaterThan(0);
  });
});
