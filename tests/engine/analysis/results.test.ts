import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, toDisplay } from '../../../src/engine';
import { clone, smallTree } from '../support/docs';

// The per-element results are built when first read (src/engine/analysis/results.ts). These tests
// hold what a consumer relies on: they behave as plain data fields, and their numbers are those
// of the SI results converted exactly as toDisplay converts them.
const demo = (): unknown => JSON.parse(readFileSync(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8'));

describe('result fields built on first read', () => {
  it('are enumerable fields in the documented order, read through JSON, spread and structured clone alike', () => {
    const a = analyzeSystem(demo());
    const keys = Object.keys(a);
    expect(keys.slice(keys.indexOf('water'), keys.indexOf('water') + 6)).toEqual(['water', 'source', 'segments', 'nodes', 'fixtures', 'criticalFixtureId']);
    const viaJson = JSON.parse(JSON.stringify(a));
    expect(viaJson.segments).toHaveLength(a.segments.length);
    expect(viaJson.si.fixtures).toEqual(JSON.parse(JSON.stringify(a.si.fixtures)));
    const spread = { ...a };
    expect(Object.getOwnPropertyDescriptor(spread, 'segments')?.value).toBe(a.segments);
    const cloned = structuredClone(a);
    expect(cloned.nodes).toEqual(a.nodes);
    expect(cloned.si.segments).toEqual(a.si.segments);
  });

  it('are built once: every read returns the same array, and a write replaces it', () => {
    const a = analyzeSystem(clone(smallTree()));
    expect(a.segments).toBe(a.segments);
    expect(a.si.nodes).toBe(a.si.nodes);
    const replaced = a.segments.slice(1);
    a.segments = replaced;
    expect(a.segments).toBe(replaced);
    // A frozen analysis still reads its fields.
    const b = Object.freeze(analyzeSystem(clone(smallTree())));
    expect(b.fixtures.length).toBeGreaterThan(0);
  });

  it('the display copies are the SI results converted by toDisplay, number for number', () => {
    const a = analyzeSystem(demo());
    const converted = toDisplay(a.si, a.unitSystem);
    expect(a.source).toStrictEqual(converted.source);
    expect(a.segments).toStrictEqual(converted.segments);
    expect(a.nodes).toStrictEqual(converted.nodes);
    expect(a.fixtures).toStrictEqual(converted.fixtures);
    // SI and display fixtures share one path array each (as the spread in toDisplay shares it).
    expect(a.fixtures[0].path).toBe(a.si.fixtures[0].path);
  });
});
