import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { firstOverBound } from '../../server/http/bounds';
import { firstOverBoundInJson } from '../../server/http/jsonPrescan';

const scan = (text: string, bounds?: { maxArrayItems: number; maxObjectKeys: number }) => firstOverBoundInJson(Buffer.from(text, 'utf8'), bounds);

describe('bounds checked on the JSON text before it is parsed', () => {
  it('when a body holds a list of empty elements over the bound, then the text scan names the list without parsing it', () => {
    const empties = Array(20_001).fill('{}').join(',');
    const body = `{"document":{"name":"x","nodes":[${empties}],"segments":[]},"version":1}`;
    expect(scan(body)).toEqual(['document.nodes', 'Has more than 20000 items; at most 20000 are accepted']);
  });

  it('when brackets, commas and escaped quotes sit inside strings, then they are not counted', () => {
    const small = { maxArrayItems: 2, maxObjectKeys: 2 };
    expect(scan(JSON.stringify({ a: ['x,y,z', '[1,2,3]'], b: 'say \\"hi\\", {a,b,c}' }), small)).toBeNull();
    expect(scan(JSON.stringify({ a: ['\\', '"', ','] }), small)).toEqual(['a', 'Has more than 2 items; at most 2 are accepted']);
    expect(scan(JSON.stringify({ 'ключ "x"': { p: 1, q: 2, r: 3 } }), small)).toEqual(['ключ "x"', 'Has more than 2 fields']);
  });

  it('when any JSON value is sent, then the text scan refuses it exactly when the walk over the parsed value does', () => {
    const bounds = { maxArrayItems: 3, maxObjectKeys: 3 };
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 4 }), (value) => {
        const text = JSON.stringify(value);
        // the server walks what JSON.parse made of the text
        const walked = firstOverBound(JSON.parse(text), bounds);
        expect(scan(text, bounds) === null).toBe(walked === null);
      }),
      { numRuns: 2000 },
    );
  });

  it('when the only list over the bound is found, then the scan and the walk name the same place', () => {
    const bounds = { maxArrayItems: 3, maxObjectKeys: 50 };
    const value = {
      document: {
        nodes: [
          { id: 'a', fixtureGroups: [1, 2] },
          { id: 'b', fixtureGroups: [1, 2, 3, 4] },
        ],
      },
    };
    // the same place; the walk can say how many items there were, the scan stops counting at one too many
    expect(scan(JSON.stringify(value), bounds)?.[0]).toBe('document.nodes.1.fixtureGroups');
    expect(firstOverBound(value, bounds)?.[0]).toBe('document.nodes.1.fixtureGroups');
  });
});
