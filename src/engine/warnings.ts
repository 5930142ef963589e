/**
 * Coded warnings: the system was computed, but a person should look at this. Each code has
 * a plain-words message and a severity:
 *   'fail'    — a design criterion is not met (residual below minimum, velocity, static pressure);
 *   'caution' — the number rests on something shaky (extrapolation, transitional flow, fallback);
 *   'note'    — an assumption the engine made, stated so the designer can confirm it.
 */

export type WarningSeverity = 'fail' | 'caution' | 'note';

export const WARNING_CODES = {
  'residual-below-minimum': {
    severity: 'fail',
    message: 'The residual pressure at this fixture is below the minimum flow pressure it needs.',
  },
  'velocity-over-limit': {
    severity: 'fail',
    message: 'The velocity at design flow is above the limit for this material and service.',
  },
  'static-over-max': {
    severity: 'fail',
    message: 'The static pressure here (source high static plus the drop in elevation) is above the maximum; a pressure-reducing valve is likely needed.',
  },
  'static-below-min': {
    severity: 'caution',
    message: 'The source low static pressure is below the minimum static pressure of the criteria.',
  },
  'device-curve-extrapolated': {
    severity: 'caution',
    message: "The design flow is beyond the device's loss curve; its loss was extrapolated (loss ∝ flow²).",
  },
  'demand-table-extrapolated': {
    severity: 'caution',
    message: 'The fixture units are outside the demand table; the design flow was extrapolated.',
  },
  'laminar-flow': {
    severity: 'caution',
    message: 'Flow in this segment is laminar at design flow (Reynolds number below 2300); f = 64/Re was used.',
  },
  'transitional-flow': {
    severity: 'caution',
    message: 'Flow in this segment is transitional at design flow (Reynolds number 2300–4000); Churchill (1977) was used and the friction factor is uncertain.',
  },
  'friction-outside-validity': {
    severity: 'caution',
    message: 'The friction correlation was used outside its published range of validity.',
  },
  'segment-no-demand': {
    severity: 'note',
    message: 'No fixtures or continuous demand are downstream of this segment; it carries no design flow.',
  },
  'fitting-method-fallback': {
    severity: 'caution',
    message: 'This fitting type has no data for the chosen loss method; another method was used for it.',
  },
  'fitting-outside-tested-re': {
    severity: 'caution',
    message: "The flow here is outside the Reynolds numbers this fitting's loss was measured over; the published loss was used as it stands.",
  },
  'pex-metal-fittings': {
    severity: 'caution',
    message:
      'This PEX segment still carries fitting types made for metal pipe; their losses are from metal-pipe tables. Choose the PEX fitting types actually installed.',
  },
  'expansion-tank-missing': {
    severity: 'caution',
    message:
      'A check valve, backflow preventer or PRV closes this hot system and it has no thermal expansion tank: heating raises the pressure toward the relief setting. Size one (result step); the adopted code and the AHJ govern.',
  },
  'critical-not-expected': {
    severity: 'note',
    message: 'The critical fixture (smallest margin) is not the one marked as expected.',
  },
  'critical-not-highest': {
    severity: 'note',
    message: 'The critical fixture is not the highest checked fixture; friction and devices, not height, decide it.',
  },
  'critical-not-farthest': {
    severity: 'note',
    message: 'The critical fixture is not the farthest checked fixture by developed length.',
  },
  'prv-active': {
    severity: 'note',
    message: 'The pressure-reducing valve limits the pressure downstream to its set pressure less its fall-off.',
  },
  'prv-inlet-below-set': {
    severity: 'note',
    message: "The pressure at the PRV's inlet is below its set pressure at design flow; it passes the inlet pressure.",
  },
  'flow-test-used': {
    severity: 'note',
    message: 'The source pressure at design flow follows the flow test: P(Q) = Ps − (Ps − Pr)·(Q/Qf)^1.85 (NFPA 291).',
  },
  'flow-test-beyond-test-flow': {
    severity: 'caution',
    message: 'The design flow at the source is above the flow-test flow; the supply curve was extrapolated.',
  },
  'flow-test-static-above-low': {
    severity: 'caution',
    message:
      'The flow-test static pressure is above the stated low static pressure; the flow test was used as measured. Check it was taken in the season of lowest pressure.',
  },
  'source-low-static-used': {
    severity: 'note',
    message: 'No flow test: the source low static pressure was taken as the pressure at design flow.',
  },
  'no-velocity-limit': {
    severity: 'note',
    message: 'The criteria have no velocity limit for this material class and service; velocity was not checked.',
  },
  'size-change-loss': {
    severity: 'note',
    message: 'The segment differs in size from the one feeding it; a sudden expansion or contraction loss at its start, carrying its own flow, was added.',
  },
  'no-checked-fixtures': {
    severity: 'caution',
    message: 'The system has no checked fixtures; no residual pressure was compared with a minimum.',
  },
  'booster-gain-at-static': {
    severity: 'note',
    message:
      'The static-pressure check counts each booster at no flow: a constant-speed pump at its shutoff gain, a variable-speed pump at its set discharge pressure (worst case for the maximum).',
  },
  'booster-beyond-curve': {
    severity: 'caution',
    message: "The flow through the booster is beyond the end of its curve (no gain left); check the pump's selection.",
  },
  'prv-fail-open-over-max': {
    severity: 'caution',
    message:
      'If this pressure-reducing valve failed open, fixtures downstream would see static pressure above the maximum. Consider a relief valve or a second valve in series; the adopted code and the AHJ govern.',
  },
  'static-over-pipe-rating': {
    severity: 'fail',
    message: "The highest static pressure in this pipe is above the material's published pressure rating at the water temperature.",
  },
  'pipe-rating-unknown': {
    severity: 'note',
    message: 'Some pipe materials have no published pressure rating in the catalog; their rating was not checked. Confirm it with the manufacturer.',
  },
  'static-below-min-at-fixture': {
    severity: 'fail',
    message: 'The low static pressure at the highest checked fixture is below the minimum static pressure of the criteria.',
  },
  'flow-override-used': {
    severity: 'note',
    message: "The segment's design flow is the entered override, not the fixture-unit demand.",
  },
  'project-data-used': {
    severity: 'note',
    message:
      "This element uses the project's own data (a fitting's K or equivalent length, or a fixture type's fixture units), not the seeded catalog; its value and source are the designer's to confirm.",
  },
  'water-temperature-assumed-range': {
    severity: 'note',
    message: 'Water properties are from IAPWS-95 (density) and IAPWS 2008 (viscosity) at 1 atm.',
  },
} as const satisfies Record<string, { severity: WarningSeverity; message: string }>;

export type WarningCode = keyof typeof WARNING_CODES;

export interface EngineWarning {
  code: WarningCode;
  severity: WarningSeverity;
  message: string;
  elementType: 'system' | 'source' | 'device' | 'node' | 'segment' | 'checked-fixture' | 'fitting';
  elementId: string | null;
  /** The name the user typed for the element, or a plain description of it; for display beside or instead of the id. */
  elementLabel?: string;
  /** Extra plain-words detail with the numbers involved, in the document's units, naming elements by their labels. */
  detail?: string;
  /** For a warning that stands for many elements of one type (notes repeated along a tree). */
  elementIds?: string[];
}

export function makeWarning(code: WarningCode, elementType: EngineWarning['elementType'], elementId: string | null, detail?: string): EngineWarning {
  const entry = WARNING_CODES[code];
  const w: EngineWarning = { code, severity: entry.severity, message: entry.message, elementType, elementId };
  if (detail !== undefined) w.detail = detail;
  return w;
}

/**
 * One warning for many elements: the first id is `elementId`, all are in `elementIds`.
 * Used for notes that would otherwise repeat on hundreds of segments of a tall building.
 */
export function makeGroupedWarning(code: WarningCode, elementType: EngineWarning['elementType'], elementIds: string[], detail?: string): EngineWarning {
  const n = elementIds.length;
  const noun = elementType === 'checked-fixture' ? 'checked fixture' : elementType;
  const w = makeWarning(code, elementType, elementIds[0] ?? null, detail ?? `${n} ${n === 1 ? noun : `${noun}s`}`);
  w.elementIds = elementIds;
  return w;
}
