/**
 * The id table that replaced Map for element ids (src/engine/analysis/idIndex.ts): it answers as a
 * Map would, for many ids, ids that share a hash bucket, and ids given twice.
 */
import { describe, expect, it } from 'vitest';
import { IdIndex } from '../../../src/engine/analysis/idIndex';
import { mulberry32 } from '../../../src/engine/testing/generateTree';

describe('IdIndex', () => {
  it('finds every id at its index and answers undefined for an id it does not hold, as a Map does', () => {
    const rand = mulberry32(7);
    const ids: string[] = [];
    for (let i = 0; i < 6000; i++) ids.push(i % 3 === 0 ? `fb-${i}` : `${Math.floor(rand() * 1e9).toString(36)}-${i}`);
    const index = IdIndex.of(ids);
    const map = new Map(ids.map((id, i) => [id, i]));
    expect(index.size).toBe(map.size);
    for (const id of ids) expect(index.get(id)).toBe(map.get(id));
    for (const probe of ['', 'fb-', 'fb-6000', 'x', 'fb-0 ']) expect(index.get(probe)).toBe(map.get(probe));
  });

  it('refuses a repeated id (the duplicate-id check) and keeps the first index', () => {
    const ids = ['a', 'b', 'a', 'é', 'e\u0301'];
    const index = new IdIndex(ids, ids.length);
    expect([0, 1, 2, 3, 4].map((i) => index.add(i))).toEqual([true, true, false, true, true]);
    expect(index.get('a')).toBe(0);
    expect(index.get('e\u0301')).toBe(4);
    expect(index.size).toBe(4);
  });

  it('holds ids whose hashes fall in one bucket (linear probing)', () => {
    // 16-slot table for 8 ids: collisions are certain.
    const ids = Array.from({ length: 8 }, (_, i) => `n${i * 16}`);
    const index = IdIndex.of(ids);
    ids.forEach((id, i) => expect(index.get(id)).toBe(i));
    expect(index.get('n1')).toBeUndefined();
  });

  it('refuses to hold more ids than its capacity (an engine defect, not a hang)', () => {
    const ids = Array.from({ length: 40 }, (_, i) => `id${i}`);
    const index = new IdIndex(ids, 8); // 16 slots, at most 8 ids
    for (let i = 0; i < 8; i++) index.add(i);
    expect(() => index.add(8)).toThrow(/engine defect/);
  });
});
