/**
 * Stage 7: the pressure ledger of one fixture, built on demand from an analysis (never for all
 * fixtures at once). It repeats, in SI and in the same order, the subtractions the hydraulics
 * stage made along the fixture's path, so its running total ends exactly (bit for bit) at the
 * fixture's residual; display values are each line converted to the document's units.
 */
import { EngineInputError } from '../errors';
import { fromSI } from '../units';
import type { Analysis, LedgerLine, PressureLedger } from './types';

export function ledgerFor(analysis: Analysis, fixtureId: string): PressureLedger {
  const k = analysis.si.fixtures.findIndex((f) => f.id === fixtureId);
  if (k === -1) {
    throw new EngineInputError({
      code: 'unknown-fixture',
      elementType: 'checked-fixture',
      elementId: fixtureId,
      field: 'id',
      message: `checked fixture "${fixtureId}" is not in this analysis`,
    });
  }
  const fx = analysis.si.fixtures[k];
  const sys = analysis.unitSystem;
  const P = (pa: number) => fromSI('pressure', pa, sys);
  const bySegId = new Map(analysis.si.segments.map((s) => [s.id, s]));
  const lines: LedgerLine[] = [];
  // Segments whose fittings include the project's own data (the note 'project-data-used' names them:
  // all in elementIds; an analysis stored before the note was grouped has one note per segment).
  const withProjectFittings = new Set(
    analysis.warnings.filter((w) => w.code === 'project-data-used' && w.elementType === 'fitting').flatMap((w) => w.elementIds ?? [w.elementId]),
  );
  let p = analysis.si.source.pressureAtDesignFlow;
  const push = (kind: LedgerLine['kind'], elementId: string, segmentId: string | null, label: string, changeSI: number) => {
    lines.push({
      step: lines.length,
      kind,
      elementId,
      segmentId,
      label,
      change: P(changeSI),
      pressureAfter: P(p),
      changeSI,
      pressureAfterSI: p,
    });
  };
  push(
    'start',
    analysis.si.source.nodeId,
    null,
    analysis.si.source.pressureBasis === 'flow-test' ? 'Source pressure at design flow (flow test)' : 'Source low static pressure',
    p,
  );
  for (const segId of fx.path) {
    const s = bySegId.get(segId)!;
    const name = s.label ?? s.id;
    for (const d of s.devices) {
      p -= d.loss;
      push('device', d.deviceId, s.id, d.label, -d.loss);
    }
    p -= s.frictionLoss;
    push('friction', s.id, s.id, `${name}: pipe friction`, -s.frictionLoss);
    p -= s.fittingLoss;
    push(
      'fittings',
      s.id,
      s.id,
      `${name}: fittings${withProjectFittings.has(s.id) ? ' (incl. project data)' : ''}${s.sizeChangeK > 0 ? ' and size change' : ''}`,
      -s.fittingLoss,
    );
    p -= s.riseLoss;
    push('rise', s.id, s.id, `${name}: elevation`, -s.riseLoss);
  }
  const display = analysis.fixtures[k];
  return {
    fixtureId,
    nodeId: fx.nodeId,
    unitSystem: sys,
    pressureUnit: analysis.units.pressure,
    lines,
    residual: display.residual,
    required: display.required,
    margin: display.margin,
    pass: display.pass,
    residualSI: p,
  };
}

/** A plain-text table of a ledger, for the command line. */
export function formatLedger(ledger: PressureLedger, analysis: Analysis): string {
  const u = ledger.pressureUnit;
  const rows: string[][] = [['#', 'item', `change (${u})`, `pressure (${u})`]];
  for (const l of ledger.lines) {
    rows.push([String(l.step), l.label, l.kind === 'start' ? '' : l.change.toFixed(3), l.pressureAfter.toFixed(3)]);
  }
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  const fmt = (r: string[]) => r.map((cell, c) => (c >= 2 ? cell.padStart(widths[c]) : cell.padEnd(widths[c]))).join('  ');
  const rule = widths.map((w) => '-'.repeat(w)).join('  ');
  const fx = analysis.fixtures.find((f) => f.id === ledger.fixtureId)!;
  return [
    `Pressure ledger: ${fx.label} (${ledger.fixtureId}) at node ${ledger.nodeId} — ${analysis.name}`,
    '',
    fmt(rows[0]),
    rule,
    ...rows.slice(1).map(fmt),
    rule,
    `Residual pressure        ${ledger.residual.toFixed(3)} ${u}`,
    `Minimum flow pressure    ${ledger.required.toFixed(3)} ${u}`,
    `Margin                   ${ledger.margin.toFixed(3)} ${u}  ${ledger.pass ? 'PASS' : 'FAIL'}`,
    analysis.criticalFixtureId === ledger.fixtureId ? 'This is the critical fixture (smallest margin).' : `Critical fixture: ${analysis.criticalFixtureId}`,
  ].join('\n');
}
