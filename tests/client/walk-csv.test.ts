import { describe, expect, it } from 'vitest';
import { parseCurvePoints, parseFixtureGroups, readDelimited } from '../../src/features/walk/lib/csv';

// Curve points and counts below are invented inputs for the parser; no engineering value is checked here.
describe('strict CSV reading for the walk', () => {
  it('when a spreadsheet range is pasted (tabs, header, blank line), then the points are read and the header skipped', () => {
    const text = 'Flow gpm\tLoss psi\n50\t1.9\n\n100\t7.8\r\n150\t17.3\n';
    expect(parseCurvePoints(text)).toEqual({
      rows: [
        { flow: 50, loss: 1.9 },
        { flow: 100, loss: 7.8 },
        { flow: 150, loss: 17.3 },
      ],
      errors: [],
    });
  });

  it('when a line has a non-number or a negative loss, then the error names that line and no point is taken from it', () => {
    const result = parseCurvePoints('10,1\n20,abc\n30,-2\n40,3,9');
    expect(result.rows).toEqual([{ flow: 10, loss: 1 }]);
    expect(result.errors).toEqual([
      'Line 2: the loss “abc” is not a number of zero or more.',
      'Line 3: the loss “-2” is not a number of zero or more.',
      'Line 4: expected 2 values (flow, loss), found 3.',
    ]);
  });

  it('when values are quoted with commas and doubled quotes inside, then they are read as one value each', () => {
    expect(readDelimited('"a, b","say ""hi""",c').rows[0].cells).toEqual(['a, b', 'say "hi"', 'c']);
    expect(readDelimited('"open,1').errors).toEqual(['Line 1: a quoted value is not closed.']);
    expect(readDelimited('x\n"a" b,1').errors).toEqual(['Line 2: a quoted value is followed by other text.']);
  });

  it('when fixture groups name an unknown node, an unknown type or a bad count, then each is refused with its line', () => {
    const known = { nodes: [{ id: 'floor-2' }, { id: 'floor-3' }], fixtureTypeIds: new Set(['lavatory-private']) };
    const result = parseFixtureGroups(
      'node,type,count\nfloor-2,lavatory-private,4\nroof,lavatory-private,1\nfloor-3,bidet,1\nfloor-3,lavatory-private,1.5\nfloor-3,lavatory-private,0',
      known,
    );
    expect(result.rows).toEqual([{ nodeId: 'floor-2', fixtureTypeId: 'lavatory-private', count: 4 }]);
    expect(result.errors).toEqual([
      'Line 3: there is no node “roof” in this system.',
      'Line 4: “bidet” is not a fixture type in the catalog.',
      'Line 5: the count “1.5” is not a whole number of 1 or more.',
      'Line 6: the count “0” is not a whole number of 1 or more.',
    ]);
  });

  it('when nothing but a header is given, then it says no rows were found instead of succeeding silently', () => {
    expect(parseCurvePoints('flow,loss\n').errors).toHaveLength(1);
    expect(parseFixtureGroups('', { nodes: [], fixtureTypeIds: new Set() }).errors).toHaveLength(1);
  });

  it('when lines name nodes as the screens do and fixtures in the trade’s words, then they are matched; a name two nodes share is refused', () => {
    const known = {
      nodes: [
        { id: 'node-2', label: 'Apartment 401' },
        { id: 'node-3', label: 'Roof' },
        { id: 'node-4', label: 'Roof' },
      ],
      fixtureTypeIds: new Set(['lavatory-private', 'lavatory-public', 'water-closet-flush-tank-private', 'kitchen-sink-private']),
    };
    const result = parseFixtureGroups(
      'node\tfixture\tcount\toccupancy\napartment 401\twater closet, flush tank\t2\t\nApartment 401\tlavatory\t1\tpublic\nnode-2\tkitchen-sink-private\t1\nRoof\tlavatory\t1\nApartment 401\tlavatory\t1\tshared',
      known,
    );
    expect(result.rows).toEqual([
      { nodeId: 'node-2', fixtureTypeId: 'water-closet-flush-tank-private', count: 2 },
      { nodeId: 'node-2', fixtureTypeId: 'lavatory-public', count: 1 },
      { nodeId: 'node-2', fixtureTypeId: 'kitchen-sink-private', count: 1 },
    ]);
    expect(result.errors).toEqual([
      "Line 5: 2 nodes are named “Roof” (node-3, node-4); write the node's id.",
      'Line 6: occupancy “shared” is neither private nor public.',
    ]);
  });
});
