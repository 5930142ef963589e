/**
 * The unit conversion follows the document's description: every ranged number whose range has a
 * unit (limits.ts) is converted, and nothing else is. The document below sets every key of the
 * description (each union option appears in some list item), so a key added to elements.ts with a
 * unit-bearing range is checked here without a line of this test.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { convertDocumentUnits } from '../../../src/engine/building/convertUnits';
import { rangedPaths, type AnyElement, type ValueShape } from '../../../src/engine/model/describe';
import { SYSTEM_DOCUMENT } from '../../../src/engine/model/elements';
import { LIMITS, type LimitQuantity } from '../../../src/engine/model/limits';
import { expectClose } from '../../helpers/expectClose';

/** A number's range has a unit that differs between US and SI (not a count, a coefficient or seconds). */
const hasUnit = (range: LimitQuantity) => LIMITS[range].unitQuantity !== null || LIMITS[range].ownQuantity !== undefined;

/** Three items per list and record: enough for every option of a union (a booster has three). */
const ITEMS = 3;

/** A value 60 % of the way up its US range: inside it, away from zero, so a conversion shows. */
const inRange = (range: LimitQuantity | undefined) => (range ? LIMITS[range].US.min + 0.6 * (LIMITS[range].US.max - LIMITS[range].US.min) : 2);

function generate(shape: ValueShape, range: LimitQuantity | undefined, variant: number): unknown {
  switch (shape.kind) {
    case 'number':
      return inRange(range);
    case 'count':
      return 2;
    case 'string':
      return 'a'.repeat(Math.max(1, shape.min));
    case 'boolean':
      return true;
    case 'literal':
      return shape.value;
    case 'enum':
      return shape.values[0];
    case 'list':
      return Array.from({ length: ITEMS }, (_, i) => generate(shape.item, range, i));
    case 'record':
      return Object.fromEntries(Array.from({ length: ITEMS }, (_, i) => [`key${i}`, generate(shape.item, range, i)]));
    case 'element':
      return generateElement(shape.element, variant);
    case 'union':
      return generateElement(shape.of[variant % shape.of.length], variant);
  }
}
function generateElement(e: AnyElement, variant: number): Record<string, unknown> {
  return Object.fromEntries(Object.entries(e.keys).map(([k, d]) => [k, generate(d.shape, d.range, variant)]));
}

/** Every number of a document by its path, list indexes and record keys written "*". */
function numbers(v: unknown, path: string[] = [], out: [concrete: string, pattern: string, value: number][] = []) {
  if (typeof v === 'number') out.push([path.join('.'), path.map((p) => (/^\d+$|^key\d+$/.test(p) ? '*' : p)).join('.'), v]);
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) numbers(x, [...path, k], out);
  return out;
}

const withUnitPaths = new Set(rangedPaths(SYSTEM_DOCUMENT, '*').flatMap(([path, range]) => (hasUnit(range) ? [path.join('.')] : [])));

describe('the unit conversion reads the description', () => {
  const withUnit = withUnitPaths;
  const doc = { ...generateElement(SYSTEM_DOCUMENT, 0), unitSystem: 'US' as const };
  const before = numbers(doc);

  it('when a document sets every key of the description, then it holds every ranged number with a unit', () => {
    // Guards the test itself: the generated document reaches every such path (hot-water figures,
    // unit types, placements' overrides, the fed-from resolution, every device and pump form).
    expect(new Set(before.map(([, pattern]) => pattern).filter((p) => withUnit.has(p)))).toEqual(withUnit);
    expect(withUnit.has('recirculation.temperatureDrop')).toBe(true);
    expect(withUnit.has('expansionTank.heaterVolume')).toBe(true);
  });

  it('when it is converted US → SI, then every number with a unit changes and every other number stays as it is', () => {
    const si = new Map(numbers(convertDocumentUnits(doc, 'SI')).map(([concrete, , value]) => [concrete, value]));
    expect(si.size).toBe(before.length);
    for (const [concrete, pattern, value] of before) {
      // Every factor between the two systems is far from 1 (1 psi = 6.894757 kPa, 1 ft = 0.3048 m,
      // 1 gal = 3.785 L, 1 Btu/h = 0.2931 W, °F → °C; NIST SP 811 App. B), so a converted value moves.
      if (withUnit.has(pattern)) expect(si.get(concrete), concrete).not.toBe(value);
      else expect(si.get(concrete), concrete).toBe(value);
    }
  });

  it('when it is converted US → SI → US with rounding, then every number returns within the rounding', () => {
    const back = new Map(numbers(convertDocumentUnits(convertDocumentUnits(doc, 'SI'), 'US')).map(([concrete, , value]) => [concrete, value]));
    for (const [concrete, , value] of before) {
      // Each way rounds to the places of the unit (convertUnits.ts, PLACES; roughness 4 significant
      // figures): half a last place twice, relative to values 60 % up their range, is at most about
      // 0.09 % (a temperature: 0.05 °C and 0.05 °F at 133 °F); 0.1 % bounds every quantity.
      expectClose(back.get(concrete)!, value, { rtol: 1e-3 }, concrete);
    }
  });
});

describe('the demo documents converted and back', () => {
  const example = (name: string) => JSON.parse(readFileSync(new URL(`../../../src/engine/examples/${name}.json`, import.meta.url), 'utf8'));
  it.each(['alder-finch-cold', 'alder-finch-hot', 'small-house'])(
    'when %s is converted to the other unit system and back with rounding, then every number returns within the rounding',
    (name) => {
      const doc = example(name);
      const other = doc.unitSystem === 'US' ? 'SI' : 'US';
      const there = convertDocumentUnits(doc, other);
      const back = new Map(numbers(convertDocumentUnits(there, doc.unitSystem)).map(([concrete, , value]) => [concrete, value]));
      const before = numbers(doc);
      expect(back.size).toBe(before.length);
      // Half a last place each way (PLACES in convertUnits.ts): the coarsest in absolute terms is a
      // pressure, 0.05 kPa (0.0073 psi) then 0.005 psi back, within 0.013 psi; from SI, 0.005 psi
      // (0.034 kPa) then 0.05 kPa, within 0.09 kPa (1 psi = 6.894757 kPa, NIST SP 811 App. B). A
      // temperature (0.05 °C = 0.09 °F, then 0.05 °F) is within 0.5 % of any the demos hold.
      const atol = doc.unitSystem === 'US' ? 0.013 : 0.09;
      for (const [concrete, , value] of before) expectClose(back.get(concrete)!, value, { rtol: 5e-3, atol }, `${name} ${concrete}`);
      // and a number without a unit is the same number
      for (const [concrete, pattern, value] of before) if (!withUnitPaths.has(pattern)) expect(back.get(concrete), concrete).toBe(value);
    },
  );
});
