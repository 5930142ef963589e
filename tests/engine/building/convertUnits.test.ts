import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { convertDocumentUnits, roundedFromSI } from '../../../src/engine/building/convertUnits';
import { analyzeSystem } from '../../../src/engine';
import { expectClose } from '../../helpers/expectClose';

const example = (name: string) => JSON.parse(readFileSync(new URL(`../../../src/engine/examples/${name}.json`, import.meta.url), 'utf8'));

describe('converting a document between unit systems', () => {
  it('when the US demo is converted to SI, then the numbers are rounded SI values (1 psi = 6.894757 kPa, NIST SP 811 B.8)', () => {
    const us = example('alder-finch-cold');
    const si = convertDocumentUnits(us, 'SI');
    expect(si.unitSystem).toBe('SI');
    expect(si.source.staticPressureLow).toBe(Number((us.source.staticPressureLow * 6.894757293168361).toFixed(1)));
    const seg = si.segments[0];
    expect(seg.length).toBe(Number((us.segments[0].length * 0.3048).toFixed(3)));
    // Names are not numbers: sizes stay as they are.
    expect(seg.size).toBe(us.segments[0].size);
    // The original is not touched.
    expect(us.unitSystem).toBe('US');
  });

  it('when converted without rounding and back, then every number returns to itself', () => {
    const us = example('alder-finch-cold');
    const back = convertDocumentUnits(convertDocumentUnits(us, 'SI', { round: false }), 'US', { round: false });
    const nums = (v: unknown, out: number[] = []): number[] => {
      if (typeof v === 'number') out.push(v);
      else if (v && typeof v === 'object') for (const x of Object.values(v)) nums(x, out);
      return out;
    };
    const a = nums(us);
    const b = nums(back);
    expect(b).toHaveLength(a.length);
    // Two conversions through SI: a few ulps (rtol 1e-12).
    a.forEach((x, i) => (x === 0 ? expect(b[i]).toBe(0) : expectClose(b[i], x, { rtol: 1e-12 })));
  });

  it('when the small SI house is converted to US with rounding, then its critical margin moves by less than 0.1 psi', () => {
    const si = example('small-house');
    const a = analyzeSystem(si);
    const b = analyzeSystem(convertDocumentUnits(si, 'US'));
    const ma = a.fixtures.find((f) => f.id === a.criticalFixtureId)!.margin; // kPa
    const mb = b.fixtures.find((f) => f.id === a.criticalFixtureId)!.margin; // psi
    // Rounding to 0.01 ft, 0.01 psi, 0.0001 in: the design itself is unchanged to well under 0.1 psi.
    expect(Math.abs(mb - ma / 6.894757293168361)).toBeLessThan(0.1);
  });

  it('when a catalog value held in SI is shown in a unit system, then it reads rounded to the places a designer writes', () => {
    // 15 gpm and 5 psi held in SI (1 gpm = 6.30901964e-5 m³/s, 1 psi = 6894.757 Pa: NIST SP 811 (2008) App. B)
    const flowSI = 15 * 6.30901964e-5;
    const lossSI = 5 * 6894.757293168361;
    expect(roundedFromSI('flow', flowSI, 'US')).toBe(15);
    expect(roundedFromSI('pressure', lossSI, 'US')).toBe(5);
    expect(roundedFromSI('flow', flowSI, 'SI')).toBe(0.9464); // 0.946353 L/s
    expect(roundedFromSI('pressure', lossSI, 'SI')).toBe(34.5); // 34.47379 kPa
    // too small for its places: four significant figures instead of zero
    expect(roundedFromSI('flow', 1e-9, 'SI')).toBe(0.000001);
  });

  it("when a hot system with a recirculation loop and an expansion tank is converted to SI, then the loop's figures are converted (1 Btu_IT/h = 0.29307107 W, 1 °F = 1/1.8 K, 1 gal = 3.785411784 L; NIST SP 811 App. B) and its flow stays within 0.1 %", () => {
    const us = example('alder-finch-hot');
    us.expansionTank = { heaterVolume: 100, coldTemperature: 50, hotTemperature: 140, supplyPressure: 60, reliefPressure: 135 };
    us.recirculation = {
      segments: [
        { id: 'out', from: 'heater', to: 'riser-base', length: 47, material: 'copper-l', size: '2' },
        { id: 'back', from: 'riser-base', to: 'heater', length: 47, material: 'copper-l', heatLoss: 900 },
      ],
      heatLossPerLength: 25,
      temperatureDrop: 10,
      hotTemperature: 140,
      heaterLoss: 1.5,
    };
    const si = convertDocumentUnits(us, 'SI');
    const wPerBtuH = 1055.05585262 / 3600;
    expect(si.recirculation.segments[0].length).toBe(Number((47 * 0.3048).toFixed(3)));
    expect(si.recirculation.segments[1].heatLoss).toBe(Number((900 * wPerBtuH).toFixed(1)));
    expect(si.recirculation.heatLossPerLength).toBe(Number(((25 * wPerBtuH) / 0.3048).toFixed(2)));
    expect(si.recirculation.temperatureDrop).toBe(Number((10 / 1.8).toFixed(2)));
    expect(si.recirculation.hotTemperature).toBe(60);
    expect(si.expansionTank.heaterVolume).toBe(Number((100 * 3.785411784).toFixed(1)));
    const a = analyzeSystem(us).recirculation;
    const b = analyzeSystem(si).recirculation;
    if (!a?.ok || !b?.ok) throw new Error('expected both loops computed');
    // Rounded inputs (0.01 W/m, 0.01 K, 1 mm): the loop flow moves by well under 0.1 %.
    expectClose(b.flow, (a.flow * 3.785411784) / 60, { rtol: 1e-3 }, 'L/s');
    expect(b.pipes.map((p) => p.size)).toEqual(a.pipes.map((p) => p.size));
  });
});
