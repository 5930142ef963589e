/**
 * Is the system closed to thermal expansion? Where a check valve, a backflow preventer or a PRV
 * sits between the main and a water heater, the heated water cannot expand back into the main,
 * and the pressure rises to the relief setting on every heating cycle unless an expansion tank
 * takes the water (IPC 607.3.2, "thermal expansion control", as commonly applied — section
 * number from memory; the adopted code governs).
 *
 * The document has no device kind for an expansion tank yet: a device of kind "other" whose label
 * names an expansion tank counts as one (see the report: a dedicated kind is the better hook).
 */
import type { SystemDocument } from '../model/schema';

export interface ClosingElement {
  elementType: 'device' | 'fitting';
  elementId: string;
  label: string;
  kind: 'backflow-preventer' | 'prv' | 'check-valve';
  /** Set when the element is in the cold system this hot system is fed from (upstream of the heater feed). */
  coldSystemName?: string;
}

export interface ClosedSystemCheck {
  closed: boolean;
  closingElements: ClosingElement[];
  hasWaterHeater: boolean;
  expansionTankPresent: boolean;
  /** Closed, with a water heater (or a hot system), and no expansion tank: show a caution. */
  cautionMissingTank: boolean;
  message: string | null;
}

const CHECK_VALVE_FITTINGS = new Set(['valve-check-swing', 'valve-check-lift']);
const TANK_LABEL = /expansion\s*tank/i;

/** How a closing element is named in words: the cold system's are named with their system. */
export function closingElementWords(c: ClosingElement): string {
  return c.coldSystemName === undefined ? c.label : `${c.label} (in the cold system "${c.coldSystemName}", upstream of the heater feed)`;
}

/**
 * Closed by the system's own devices and check valves, and — for a hot system fed from a cold one —
 * by the cold system's backflow preventers, PRVs and check valves between its source and the heater
 * feed (recorded on `source.fedFrom.resolution.closedBy` by fedFrom.ts): the water heated cannot
 * push back past them either.
 */
export function closedSystemCheck(
  doc: Pick<SystemDocument, 'devices' | 'segments' | 'service'> & { source?: Pick<SystemDocument['source'], 'fedFrom'> },
): ClosedSystemCheck {
  const closingElements: ClosingElement[] = [];
  const resolution = doc.source?.fedFrom?.resolution;
  if (resolution?.status === 'resolved') {
    for (const c of resolution.closedBy ?? []) {
      closingElements.push({
        elementType: c.kind === 'check-valve' ? 'fitting' : 'device',
        elementId: c.elementId,
        label: c.label,
        kind: c.kind,
        coldSystemName: resolution.systemName,
      });
    }
  }
  for (const d of doc.devices) {
    if (d.kind === 'backflow-preventer' || d.kind === 'prv') {
      closingElements.push({ elementType: 'device', elementId: d.id, label: d.label, kind: d.kind });
    }
  }
  for (const s of doc.segments) {
    for (const f of s.fittings) {
      if (CHECK_VALVE_FITTINGS.has(f.typeId)) {
        closingElements.push({ elementType: 'fitting', elementId: s.id, label: s.label ?? `segment ${s.id}`, kind: 'check-valve' });
      }
    }
  }
  const hasWaterHeater = doc.service === 'hot' || doc.devices.some((d) => d.kind === 'water-heater');
  const expansionTankPresent = doc.devices.some((d) => d.kind === 'other' && TANK_LABEL.test(d.label));
  const closed = closingElements.length > 0;
  const cautionMissingTank = closed && hasWaterHeater && !expansionTankPresent;
  return {
    closed,
    closingElements,
    hasWaterHeater,
    expansionTankPresent,
    cautionMissingTank,
    message: cautionMissingTank
      ? `The system is closed by ${closingElements.map(closingElementWords).join(', ')} and has no expansion tank: heated water will raise the pressure to the relief setting. Size a thermal expansion tank; the adopted code and the AHJ govern.`
      : null,
  };
}
