/**
 * The result as tables for the engineer's report: every segment, every checked fixture and every
 * fixture's pressure ledger, as numbers in the project's units with the unit in each column's
 * heading (a spreadsheet computes with them; the PDF prints them). Every number is the analysis's
 * own (src/engine/analysis); elements are named as the user typed them (the summary's names).
 */
import { ledgerFor, verdictStatus, type Analysis, type SystemDocument } from '../../src/engine';
import { MATERIALS } from '../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import { fittingLabel } from '../../src/engine/model/labels';
import { frictionBasis, namesOf } from '../pdf/summaryTables';

export type Cell = string | number | null;

export interface ResultTable {
  /** the sheet's and the file's name */
  id: 'segments' | 'fixtures' | 'ledgers';
  title: string;
  columns: string[];
  rows: Cell[][];
}

export interface ResultTables {
  /** one line above every table: the verdict, so numbers of an incomplete or failing design are never read as a pass */
  heading: string;
  tables: ResultTable[];
}

const VERDICT_WORDS = { pass: 'PASS', fail: 'FAIL', incomplete: 'INCOMPLETE — not a check: items are missing from the description' } as const;

export function resultTables(a: Analysis, doc: SystemDocument, context: { systemName: string; revisionNumber: number; status: string }): ResultTables {
  const u = a.units;
  const names = namesOf(a, doc);
  const basis = frictionBasis(a.unitSystem);
  const docSeg = new Map(doc.segments.map((s) => [s.id, s]));
  const heading = `${context.systemName}, revision ${context.revisionNumber} (${context.status}): ${VERDICT_WORDS[verdictStatus(a)]}; engine ${a.engineVersion}`;

  const segments: ResultTable = {
    id: 'segments',
    title: 'Segments',
    columns: [
      'Segment',
      'From',
      'To',
      'Material',
      'Size',
      `Inside diameter (${u.diameter})`,
      `Length (${u.length})`,
      `Rise (${u.elevation})`,
      'Fittings',
      'Sum of K',
      `Design flow (${u.flow})`,
      `Velocity (${u.velocity})`,
      'Velocity within limit',
      `Friction loss (${u.pressure})`,
      `Friction per ${basis.label} (${u.pressure})`,
      `Fitting loss (${u.pressure})`,
    ],
    rows: a.segments.map((s) => {
      const d = docSeg.get(s.id);
      const material = d?.material ? (MATERIALS[d.material as keyof typeof MATERIALS]?.label ?? d.material) : 'custom pipe';
      const fittings = (d?.fittings ?? [])
        .map((f) => `${f.count}× ${f.custom ? fittingLabel(f, u.length) : (FITTING_TYPES[f.typeId]?.label ?? f.typeId)}`)
        .join('; ');
      return [
        names.segment(s.id),
        names.node(s.from),
        names.node(s.to),
        material,
        d?.size ?? null,
        s.innerDiameter,
        s.length,
        s.rise,
        fittings || 'none',
        s.totalK,
        s.designFlow,
        s.velocity,
        s.velocityPass === null ? null : s.velocityPass ? 'yes' : 'no',
        s.frictionLoss,
        // the analysis's own friction loss spread over its length (no hydraulics here)
        s.length > 0 ? (s.frictionLoss / s.length) * basis.per : null,
        s.fittingLoss,
      ];
    }),
  };

  const fixtures: ResultTable = {
    id: 'fixtures',
    title: 'Checked fixtures',
    columns: [
      'Fixture',
      'At',
      `Residual pressure (${u.pressure})`,
      `Minimum flow pressure (${u.pressure})`,
      `Margin (${u.pressure})`,
      'Meets its minimum',
      'Critical',
      `Flow (${u.flow})`,
      `Elevation (${u.elevation})`,
      `Developed length (${u.length})`,
    ],
    rows: a.fixtures.map((f) => [
      f.label,
      names.node(f.nodeId),
      f.residual,
      f.required,
      f.margin,
      f.pass ? 'yes' : 'no',
      f.id === a.criticalFixtureId ? 'critical' : '',
      f.flowRate,
      f.elevation,
      f.developedLength,
    ]),
  };

  const KIND = {
    start: 'Start: pressure at the source at design flow',
    device: 'Device',
    friction: 'Pipe friction',
    fittings: 'Fittings',
    rise: 'Elevation',
  } as const;
  const ledgers: ResultTable = {
    id: 'ledgers',
    title: 'Pressure ledgers',
    columns: ['Fixture', 'Step', 'Kind', 'Element', 'Segment', `Change (${u.pressure})`, `Pressure after (${u.pressure})`],
    rows: a.fixtures.flatMap((f) => {
      const ledger = ledgerFor(a, f.id);
      return ledger.lines.map((l) => [f.label, l.step, KIND[l.kind], l.label, l.segmentId ? names.segment(l.segmentId) : null, l.change, l.pressureAfter]);
    }),
  };
  return { heading, tables: [segments, fixtures, ledgers] };
}
