/**
 * The thermal expansion tank of a document: sized from its `expansionTank` inputs (in the document's
 * units) with thermalExpansionTank (IAPWS densities, Boyle's law), and the caution where a closed
 * hot system (closedSystem.ts) has no tank.
 */
import type { SystemDocument } from '../model/schema';
import { M3_PER_GAL, toSI } from '../units';
import { makeWarning, type EngineWarning } from '../warnings';
import { closedSystemCheck } from './closedSystem';
import { HotWaterInputError, type HotWaterErrorCode } from './errors';
import { thermalExpansionTank, type ExpansionTankResult } from './expansionTank';

/** 1 L = 0.001 m³ (exact, SI definition); 1 US gal = 3.785411784 L (exact, units.ts). */
const M3_PER_L = 1e-3;

export type ExpansionTankSizing =
  | {
      ok: true;
      /** Tank volume needed and water gained, in the document's volume unit (gal or L). */
      tankVolume: number;
      expansionVolume: number;
      volumeUnit: 'gal' | 'L';
      result: ExpansionTankResult;
    }
  | { ok: false; error: { code: HotWaterErrorCode; field: string | null; message: string } };

/** The tank sized from the document's inputs; null when the document describes no tank. */
export function sizeDocumentExpansionTank(doc: Pick<SystemDocument, 'expansionTank' | 'unitSystem'>): ExpansionTankSizing | null {
  const t = doc.expansionTank;
  if (!t) return null;
  const sys = doc.unitSystem;
  const m3PerUnit = sys === 'US' ? M3_PER_GAL : M3_PER_L;
  try {
    const result = thermalExpansionTank({
      heaterVolumeM3: t.heaterVolume * m3PerUnit,
      coldC: toSI('temperature', t.coldTemperature, sys),
      hotC: toSI('temperature', t.hotTemperature, sys),
      supplyPa: toSI('pressure', t.supplyPressure, sys),
      reliefPa: toSI('pressure', t.reliefPressure, sys),
    });
    return {
      ok: true,
      tankVolume: result.tankVolumeM3 / m3PerUnit,
      expansionVolume: result.expansionVolumeM3 / m3PerUnit,
      volumeUnit: sys === 'US' ? 'gal' : 'L',
      result,
    };
  } catch (e) {
    if (e instanceof HotWaterInputError)
      return { ok: false, error: { code: e.code, field: e.field === null ? null : `expansionTank.${e.field}`, message: e.message } };
    throw e;
  }
}

/** The closed-system caution: a closed hot system (or one with a water heater) without an expansion tank. */
export function expansionTankWarnings(doc: SystemDocument, warnings: EngineWarning[]): void {
  const check = closedSystemCheck(doc);
  if (!check.cautionMissingTank || doc.expansionTank) return;
  warnings.push(makeWarning('expansion-tank-missing', 'system', null, check.message ?? undefined));
}
