/**
 * The labels and help the walk's form rows read from the document's description (elements.ts,
 * through src/features/walk/lib/described.ts): every key has a label a form can show, the unit is
 * the one its range gives in each unit system (units.ts, limits.ts), and a label never writes its
 * unit itself (the row appends it, so it would be written twice).
 */
import { describe, expect, it } from 'vitest';
import { describedElements, EXPANSION_TANK, NODE, PRV, RECIRCULATION, SOURCE } from '../../src/engine/model/elements';
import { fieldUnit } from '../../src/engine';
import { describedCell, describedField, inSentence } from '../../src/features/walk/lib/described';

const everyKey = Object.entries(describedElements()).flatMap(([name, e]) => Object.entries(e.keys).map(([key, d]) => ({ where: `${name}.${key}`, d })));

describe('the description’s labels, as forms use them', () => {
  it('when any key of any described element is read, then its label is non-empty text without surrounding spaces, and its help, if any, too', () => {
    expect(everyKey.length).toBeGreaterThan(100);
    for (const { where, d } of everyKey) {
      expect(d.label.trim(), where).not.toBe('');
      expect(d.label, where).toBe(d.label.trim());
      if (d.help !== undefined) expect(d.help.trim(), where).not.toBe('');
    }
  });

  it('when a key has a range with a unit, then its label does not write a unit in parentheses (the row appends it)', () => {
    for (const { where, d } of everyKey) {
      if (!d.range || fieldUnit(d.range, 'US') === '') continue;
      for (const sys of ['US', 'SI'] as const) expect(d.label.endsWith(`(${fieldUnit(d.range, sys)})`), where).toBe(false);
    }
  });

  it('when a row is built for a key, then it reads the description’s label with the unit of the document’s unit system and its help as the hint', () => {
    // psi/kPa, ft/m, gal/L, Btu/h per ft / W/m, psi per gpm / kPa per L/s: the units of each system (units.ts, limits.ts)
    expect(describedField(SOURCE, 'staticPressureLow', 'US')).toEqual({ label: 'Static pressure, low (psi)', hint: SOURCE.keys.staticPressureLow.help });
    expect(describedField(SOURCE, 'staticPressureLow', 'SI').label).toBe('Static pressure, low (kPa)');
    expect(describedField(NODE, 'elevation', 'SI', { after: 'of the connection' }).label).toBe('Elevation of the connection (m)');
    expect(describedField(EXPANSION_TANK, 'heaterVolume', 'SI').label).toBe('Volume of water heated (L)');
    expect(describedField(RECIRCULATION, 'heatLossPerLength', 'SI').label).toBe('Heat loss per length of pipe (W/m)');
    expect(describedField(PRV, 'falloffPerFlow', 'US').label).toBe('PRV fall-off (psi per gpm)');
    // a key without help has no hint; a key without a range no unit
    expect(describedField(SOURCE, 'kind', 'US')).toEqual({ label: 'Kind of source' });
    expect(describedCell('Device 2', PRV, 'setPressure', 'US').label).toBe('Device 2 PRV set pressure (psi)');
  });

  it('when a label goes inside a sentence, then only a plain first word loses its capital', () => {
    expect(inSentence('Developed length')).toBe('developed length');
    expect(inSentence('PRV set pressure')).toBe('PRV set pressure');
    expect(inSentence('Hazen–Williams C')).toBe('Hazen–Williams C');
  });
});
