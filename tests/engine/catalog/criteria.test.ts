import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { CRITERIA_SOURCES, DEFAULT_CRITERIA } from '../../../src/engine/catalog/criteria';

const PSI = 6894.757293168361;
const FT = 0.3048;
const EXACT = { rtol: 1e-12 };

describe('DEFAULT_CRITERIA (defaults the local code overrides)', () => {
  it('80 psi maximum static pressure (IPC 604.8, UPC 608.2, IRC P2903.3.1)', () => {
    expectClose(DEFAULT_CRITERIA.maxStaticPressurePa, 80 * PSI, EXACT);
    expect(CRITERIA_SOURCES.maxStaticPressurePa).toMatch(/IPC 604\.8/);
    expect(CRITERIA_SOURCES.maxStaticPressurePa).toMatch(/UPC 608\.2/);
    expect(CRITERIA_SOURCES.maxStaticPressurePa).toMatch(/IRC P2903\.3\.1/);
  });
  it('velocity: 8 ft/s cold, 5 ft/s hot in copper, 8 ft/s for plastic and steel (NSPC 10.14.1)', () => {
    const limit = (material: string, service: string) => DEFAULT_CRITERIA.velocityLimits.find((v) => v.material === material && v.service === service)!;
    expectClose(limit('copper', 'cold').maxVelocityMs, 8 * FT, EXACT);
    expectClose(limit('copper', 'hot').maxVelocityMs, 5 * FT, EXACT);
    for (const material of ['plastic', 'steel']) {
      for (const service of ['cold', 'hot']) expectClose(limit(material, service).maxVelocityMs, 8 * FT, EXACT);
    }
    for (const v of DEFAULT_CRITERIA.velocityLimits) expect(v.source).toMatch(/NSPC 10\.14\.1/);
    expect(DEFAULT_CRITERIA.velocityLimits).toHaveLength(6);
  });
  it('methods default to Colebrook, Crane and the IPC Hunter table', () => {
    expect(DEFAULT_CRITERIA).toMatchObject({
      frictionMethod: 'colebrook',
      fittingMethod: 'crane',
      demandMethod: 'hunter-table',
      demandCurve: 'auto',
    });
  });
  it('every field has a source string', () => {
    for (const key of Object.keys(DEFAULT_CRITERIA) as (keyof typeof CRITERIA_SOURCES)[]) {
      expect(CRITERIA_SOURCES[key]?.length, key).toBeGreaterThan(10);
    }
  });
  it('cannot be changed in place (no module-level mutable state)', () => {
    expect(Object.isFrozen(DEFAULT_CRITERIA)).toBe(true);
    expect(Object.isFrozen(DEFAULT_CRITERIA.velocityLimits)).toBe(true);
  });
});
