import { describe, expect, it } from 'vitest';
import { formatFixtureSchedule, matchFixtureType, parseFixtureSchedule } from '../../../src/engine/building/schedule';

// Schedules here are invented; the fixture names are the ordinary trade names (common practice).

describe('fixture schedule by name', () => {
  it('when a schedule uses the trade words, then each row matches its catalog fixture type', () => {
    const text = [
      'Floor,Unit,Fixture,Count,Occupancy',
      'Level 2,Apt 201,"water closet, flush tank",1,private',
      'Level 2,Apt 201,Lavatory,2,',
      'Level 2,Apt 201,shower,1,private',
      'Level 1,Restroom,Lavatory,3,public',
      'Level 1,Restroom,"water closet, flushometer valve",2,public',
    ].join('\n');
    const { rows, fileErrors } = parseFixtureSchedule(text);
    expect(fileErrors).toEqual([]);
    expect(rows.map((r) => [r.line, r.fixtureTypeId, r.count, r.error])).toEqual([
      [2, 'water-closet-flush-tank-private', 1, null],
      [3, 'lavatory-private', 2, null],
      [4, 'shower-private', 1, null],
      [5, 'lavatory-public', 3, null],
      [6, 'water-closet-flush-valve-public', 2, null],
    ]);
  });

  it('when a range is pasted from a spreadsheet (tabs), then it reads the same', () => {
    const { rows } = parseFixtureSchedule('floor\tunit\tfixture\tcount\nLevel 3\tApt 301\tkitchen sink\t1\n');
    expect(rows[0]).toMatchObject({ floor: 'Level 3', unit: 'Apt 301', fixtureTypeId: 'kitchen-sink-private', count: 1, error: null });
  });

  it('when a row names an unknown fixture or a count that is not a whole positive number, then the error names the line', () => {
    const { rows } = parseFixtureSchedule(['floor,unit,fixture,count', 'L1,A,jacuzzi,1', 'L1,A,lavatory,1.5', 'L1,A,lavatory,0', 'L1,,lavatory,1'].join('\n'));
    expect(rows.map((r) => r.error)).toEqual([
      expect.stringMatching(/^Line 2: "jacuzzi" is not a fixture type/),
      expect.stringMatching(/^Line 3: count "1.5" is not a whole number/),
      expect.stringMatching(/^Line 4: count "0" is not a whole number/),
      expect.stringMatching(/^Line 5: no unit or room named/),
    ]);
  });

  it('when the header is missing a column, or the file is not text or too large, then the file is refused as a whole', () => {
    expect(parseFixtureSchedule('floor,unit,count\nL1,A,1').fileErrors[0]).toMatch(/"fixture" is missing/);
    expect(parseFixtureSchedule('floor,unit\u0000,fixture').fileErrors[0]).toMatch(/not a text/);
    expect(parseFixtureSchedule('x'.repeat(1024 * 1024 + 1)).fileErrors[0]).toMatch(/larger than 1 MiB/);
  });

  it('when a schedule is exported and read back, then every row matches the same fixture type', () => {
    const out = formatFixtureSchedule([
      { floor: 'Level 1', unit: 'Restroom', fixtureTypeId: 'lavatory-public', count: 3 },
      { floor: 'Level 2', unit: 'Apt 201', fixtureTypeId: 'water-closet-flush-tank-private', count: 1 },
      { floor: 'Level 2', unit: 'Apt 201', fixtureTypeId: 'dishwasher-private', count: 1 },
    ]);
    const back = parseFixtureSchedule(out);
    expect(back.fileErrors).toEqual([]);
    expect(back.rows.map((r) => r.fixtureTypeId)).toEqual(['lavatory-public', 'water-closet-flush-tank-private', 'dishwasher-private']);
  });

  it('when private and public share a name, then the occupancy picks the row', () => {
    expect(matchFixtureType('Lavatory', 'public')?.id).toBe('lavatory-public');
    expect(matchFixtureType('Lavatory', 'private')?.id).toBe('lavatory-private');
  });
});
