/**
 * The issued summary: the PDF an inspector receives for one issued revision. Made from the stored
 * revision (its document and the server's analysis) and the header frozen at issue time, so the
 * same input gives the same bytes (the dates come from the issue time, not the clock).
 */
import { PDFDocument, PDFName, PDFNumber, PDFString } from 'pdf-lib';
import { ledgerFor, fromSI, sizingBasisText, type Analysis, type LedgerLine, type SystemDocument } from '../../src/engine';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { CRITERIA_SOURCES } from '../../src/engine/catalog/criteria';
import {
  boosterText,
  DEVICE_KIND_LABELS,
  fixtureGroupLabel,
  fixtureGroupWsfu,
  SOURCE_KIND_LABELS,
  WARNING_SEVERITY_WORDS,
} from '../../src/engine/model/labels';
import { SUMMARY_CAUTIONS, type SummaryHeader } from '../../src/shared/api/summaries';
import { fixtureLedgers, frictionBasis, namesOf, segmentRows, zoneRows, type Names } from './summaryTables';
import { adoptedCodeText, attestationLines, permitFrame, permitRows, type AttestationText } from './permitContent';
import type { FieldChangeRecord } from '../../src/shared/api/fieldChanges';
import { embedFonts } from './fonts';
import { reviewResponsesSection, type ReviewResponses } from './sections/reviewResponses';
import { recirculationSection } from './sections/recirculation';
import { riserDiagramSection } from './riserSection';
import { COLORS, Layout, PAGE_SIZES } from './layout';
import { drawProfile, profilePoints } from './chart';
import { num, signed, withUnit } from '../../src/shared/format/quantity';
import { utc } from './format';
import {
  catalogSourcesUsed,
  fedFromText,
  isUnverified,
  sourceText,
  staticCheckContent,
  summaryVerdict,
  UNVERIFIED_NOTE,
  groupedWarningRows,
  type FailureAcknowledgementText,
  type SummaryVerdict,
} from './summaryContent';

export interface SummaryPdfInput {
  header: SummaryHeader;
  document: SystemDocument;
  analysis: Analysis;
  /** the accepted field change this revision came from, when it did */
  fieldChange?: FieldChangeRecord | null;
  /** a failing revision's acknowledgement by the designer, recorded at issue */
  failureAcknowledgement?: FailureAcknowledgementText | null;
  /** the returned review(s) this revision answers, with the designer's replies */
  reviewResponses?: ReviewResponses[];
  /** the preparer's attestation recorded at issue (absent for revisions issued before attestations) */
  attestation?: AttestationText | null;
}

/** What every section builder sees: the layout cursor, the inputs, and what is worked out once. */
export interface SummaryContext {
  pdf: PDFDocument;
  L: Layout;
  input: SummaryPdfInput;
  header: SummaryHeader;
  doc: SystemDocument;
  a: Analysis;
  u: Analysis['units'];
  verdict: SummaryVerdict;
  names: Names;
  critical: Analysis['fixtures'][number] | null;
  catalogRows: ReturnType<typeof catalogSourcesUsed>;
  P: (v: number | null | undefined) => string;
}

/** One part of the summary, drawn in list order; a new part is a new entry (see SUMMARY_SECTIONS). */
export interface SummarySection {
  id: string;
  build: (c: SummaryContext) => void;
}

export interface SummaryPdf {
  bytes: Uint8Array;
  pageCount: number;
}

// the screens' own words (src/engine/model/labels.ts)
const DEVICE_KIND: Record<string, string> = DEVICE_KIND_LABELS;
const SOURCE_KIND: Record<string, string> = SOURCE_KIND_LABELS;
const SEVERITY: Record<string, string> = WARNING_SEVERITY_WORDS;

export async function renderSummaryPdf(input: SummaryPdfInput, sections: readonly SummarySection[] = SUMMARY_SECTIONS): Promise<SummaryPdf> {
  const { header, document: doc, analysis: a } = input;
  // throws for an incomplete analysis: an incomplete revision never gets a summary
  const verdict = summaryVerdict(a, input.failureAcknowledgement);
  const pdf = await PDFDocument.create({ updateMetadata: false });
  const issued = new Date(header.issuedAt);
  pdf.setTitle(`Issued summary: ${header.projectName}, ${header.systemName}, revision ${header.revisionNumber}`);
  pdf.setAuthor(header.preparerName);
  pdf.setSubject('Water supply pressure check');
  pdf.setCreator(`Headroom (engine ${a.engineVersion})`);
  pdf.setProducer('Headroom');
  pdf.setCreationDate(issued);
  pdf.setModificationDate(issued);

  const fonts = await embedFonts(pdf);
  const L = new Layout(pdf, fonts, a.unitSystem === 'US' ? PAGE_SIZES.letter : PAGE_SIZES.a4);
  const u = a.units;
  const c: SummaryContext = {
    pdf,
    L,
    input,
    header,
    doc,
    a,
    u,
    verdict,
    names: namesOf(a, doc),
    critical: a.fixtures.find((f) => f.id === a.criticalFixtureId) ?? null,
    catalogRows: catalogSourcesUsed(doc, a.criteria.fittingMethod),
    P: (v) => num(v, u.pressure),
  };
  for (const section of sections) section.build(c);

  if (L.missing.size) {
    // a name typed in a script the embedded font does not cover: say so rather than print "?" silently
    const chars = [...L.missing].slice(0, 40).map((ch) => `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`);
    L.heading('Characters not shown', 2, 40);
    L.paragraph(
      `The font of this summary cannot show ${L.missing.size === 1 ? 'one character' : `${L.missing.size} characters`} of its text (names and notes as typed, or catalog text); each is printed as "?": ${chars.join(', ')}${L.missing.size > 40 ? ', …' : ''}. The revision on Headroom keeps every name exactly as typed.`,
      { size: 8.5 },
    );
  }

  const permit = permitFrame(header);
  L.frame(
    {
      left: `${verdict.word} · ${header.projectName}${header.address ? ` — ${header.address}` : ''}`,
      right: `Revision ${header.revisionNumber} · issued ${utc(header.issuedAt).slice(0, 10)} · ${header.systemName}`,
      left2: permit.left,
      right2: permit.right,
    },
    { left: `Prepared by ${header.preparerName}`, middle: `Inputs ${header.inputHash.slice(0, 16)}` },
  );

  const bytes = await pdf.save({ useObjectStreams: true, objectsPerTick: Number.POSITIVE_INFINITY });
  return { bytes, pageCount: L.pages.length };
}

/**
 * The summary's parts in print order. Another part (a response to review comments, a cover of
 * several systems) is one more entry here, built in its own file.
 */
export const SUMMARY_SECTIONS: readonly SummarySection[] = [
  { id: 'title', build: titleSection },
  // the answers to the returned review come first: the reviewer reads them before anything else
  {
    id: 'review-responses',
    build: (c) => {
      if (c.input.reviewResponses) reviewResponsesSection(c.L, c.input.reviewResponses);
    },
  },
  { id: 'basis', build: basisSection },
  { id: 'inputs', build: inputsSection },
  { id: 'results', build: resultsSection },
  { id: 'zones', build: zonesSection },
  { id: 'recirculation', build: recirculationSection },
  { id: 'cautions', build: cautionsSection },
  { id: 'preparer', build: preparerSection },
  { id: 'riser-diagram', build: riserDiagramSection },
  { id: 'ledgers', build: ledgerAppendix },
];

/** The verdict first, then the title, the project and its permit, the result box and any field change. */
function titleSection(c: SummaryContext) {
  const { L, header, a, verdict, input } = c;
  const fail = verdict.status === 'fail';
  L.gap(2);
  L.draw(verdict.headline, L.left, L.y - 14, { font: 'bold', size: 15, color: fail ? COLORS.fail : COLORS.accent });
  L.gap(22);
  if (verdict.acknowledgement) L.paragraph(verdict.acknowledgement, { font: 'bold', size: 9, color: COLORS.fail, after: 4 });
  L.gap(4);
  L.draw('Water supply pressure check', L.left, L.y - 16, { font: 'bold', size: 17, color: COLORS.accent });
  L.gap(22);
  L.draw('Issued summary', L.left, L.y - 12, { size: 11, color: COLORS.muted });
  L.gap(22);
  L.keyValues([
    ['Project', header.projectName],
    ['Address', header.address || 'not stated'],
    ['System', `${header.systemName} (${a.service === 'hot' ? 'hot water' : 'cold water'})`],
    ['Revision', `${header.revisionNumber}, issued ${utc(header.issuedAt)}`],
    ['Prepared by', header.preparerEmail ? `${header.preparerName} <${header.preparerEmail}>` : header.preparerName],
    ...permitRows(header),
    ...(header.note ? ([['Note', header.note]] as [string, string][]) : []),
  ]);
  verdictBox(L, `Result: ${verdict.headline}`, verdict.acknowledgement ? [...verdict.lines, verdict.acknowledgement] : verdict.lines, fail);
  if (input.fieldChange) fieldChangeSection(L, input.fieldChange);
}

/** The basis: code, criteria, water, engine; the methods and every catalog source used. */
function basisSection(c: SummaryContext) {
  const { L, header, a, u, doc, P, catalogRows } = c;
  L.heading('Basis');
  const minimums = new Map<string, { required: number; label: string }>();
  for (const f of a.fixtures)
    if (!minimums.has(f.fixtureTypeId))
      minimums.set(f.fixtureTypeId, { required: f.required, label: FIXTURE_TYPES[f.fixtureTypeId]?.label ?? f.fixtureTypeId });
  const overrides = doc.criteria ?? {};
  L.keyValues([
    ['Code adopted', header.permit ? adoptedCodeText(header.permit) : 'not recorded'],
    ['Code basis (designer)', header.codeBasis || 'not stated by the designer'],
    [
      'Maximum static pressure',
      `${withUnit(a.criteria.maxStaticPressure, u.pressure)}: ${overrides.maxStaticPressure !== undefined ? 'set by the designer' : sourceText(CRITERIA_SOURCES.maxStaticPressurePa)}`,
    ],
    [
      'Minimum static pressure',
      a.criteria.minStaticPressure === null ? 'not set' : `${withUnit(a.criteria.minStaticPressure, u.pressure)}, set by the designer`,
    ],
    ['Pipe sizes', sizingBasisText(doc)],
    [
      'Water temperature',
      `${num(a.water.temperature, u.temperature)} ${u.temperature}: density ${withUnit(a.water.densityKgM3, 'kg/m³')}, kinematic viscosity ${withUnit(a.water.kinematicViscosityM2s * 1e6, 'mm²/s', 'kinematic viscosity')}`,
    ],
    ['Engine', `Headroom engine ${a.engineVersion}, document schema ${a.schemaVersion}`],
  ]);
  L.heading('Methods', 2);
  L.table(
    [
      { header: 'Step', width: 16 },
      { header: 'Method', width: 40, wrap: true },
      { header: 'Published source', width: 44, wrap: true },
    ],
    (
      [
        ['Demand', a.methods.demand],
        ['Pipe friction', a.methods.friction],
        ['Fitting losses', a.methods.fittings],
        ['Devices', a.methods.devices],
        ['Supply pressure', a.methods.supply],
        ['Elevation', a.methods.elevation],
        ['Water properties', a.methods.water],
      ] as const
    ).map(([step, m]) => ({ cells: [step, m.label, sourceText(m.source, m as { verified?: boolean })] })),
    { continued: 'Methods' },
  );
  if (catalogRows.length) {
    L.heading('Catalog data used', 2, 120);
    L.paragraph(`Each entry's own sources, as the catalog records them. Entries marked "${UNVERIFIED_NOTE}" are not verified.`, {
      size: 8,
      color: COLORS.muted,
    });
    L.table(
      [
        { header: 'Kind', width: 14 },
        { header: 'Entry', width: 26, wrap: true },
        { header: 'Published source', width: 60, wrap: true },
      ],
      catalogRows.map((r) => ({ cells: [r.kind, r.item, r.source], style: r.verified ? undefined : { bold: true } })),
      { continued: 'Catalog data used' },
    );
  }
  L.heading('Minimum flow pressures used', 2);
  L.table(
    [
      { header: 'Fixture type', width: 34, wrap: true },
      { header: `Minimum (${u.pressure})`, width: 14, align: 'right' },
      { header: 'Source', width: 52, wrap: true },
    ],
    [...minimums].map(([id, m]) => ({
      cells: [
        m.label,
        P(m.required),
        overrides.minFlowPressures?.[id] !== undefined
          ? 'set by the designer'
          : FIXTURE_TYPES[id]
            ? sourceText(FIXTURE_TYPES[id].source, FIXTURE_TYPES[id])
            : 'project fixture type (the designer’s data)',
      ],
    })),
    { continued: 'Minimum flow pressures used' },
  );
  L.heading('Velocity limits', 2);
  L.table(
    [
      { header: 'Material class', width: 18 },
      { header: 'Service', width: 12 },
      { header: `Limit (${u.velocity})`, width: 14, align: 'right' },
      { header: 'Source', width: 56, wrap: true },
    ],
    a.criteria.velocityLimits.map((v) => ({
      cells: [v.material, v.service, num(v.maxVelocity, u.velocity), sourceText(v.source, v as { verified?: boolean })],
    })),
    { continued: 'Velocity limits' },
  );
}

/** The inputs: supply, devices, fixtures served and every segment with its losses. */
function inputsSection(c: SummaryContext) {
  const { L, a, u, doc, names } = c;
  const segById = new Map(a.segments.map((s) => [s.id, s]));
  const nodeById = new Map(a.nodes.map((n) => [n.id, n]));
  const nodeLabel = names.node;
  // ---- inputs
  L.heading('Inputs');
  L.heading('Supply', 2);
  const src = doc.source;
  const fedFrom = fedFromText(doc, u.pressure);
  L.keyValues([
    ['Source', `${SOURCE_KIND[src.kind] ?? src.kind} at node ${nodeLabel(src.nodeId)} (elevation ${withUnit(a.source.elevation, u.elevation)})`],
    ...(fedFrom ? ([['Hot water fed from', fedFrom]] as [string, string][]) : []),
    ['Static pressure', `low ${withUnit(src.staticPressureLow, u.pressure)}, high ${withUnit(src.staticPressureHigh, u.pressure)}`],
    ['Basis of the figure', src.pressureBasis],
    ['Date of the figure', src.pressureDate ?? 'not stated'],
    ...(src.flowTest
      ? ([
          [
            'Flow test',
            `static ${withUnit(src.flowTest.staticPressure, u.pressure)}, residual ${withUnit(src.flowTest.residualPressure, u.pressure)} at ${withUnit(src.flowTest.flow, u.flow)}${src.flowTest.date ? `, ${src.flowTest.date}` : ''}`,
          ],
        ] as [string, string][])
      : []),
    [
      'At design flow',
      `${withUnit(a.source.pressureAtDesignFlow, u.pressure)} at ${withUnit(a.source.designFlow, u.flow)} (${a.source.pressureBasis === 'flow-test' ? 'from the flow test' : 'the low static pressure'})`,
    ],
  ]);

  L.heading('Devices', 2);
  const deviceRows = doc.devices.map((d) => {
    const seg = segById.get(d.segmentId);
    const r = seg?.devices.find((x) => x.deviceId === d.id);
    const notes = [
      r?.extrapolated ? 'loss extrapolated beyond the curve' : '',
      d.prv ? `set ${withUnit(d.prv.setPressure, u.pressure)}` : '',
      d.boost ? boosterText(d.boost, u.pressure) : '',
      d.loss.kind === 'curve' ? `curve of ${d.loss.points.length} point(s)` : 'fixed loss',
    ].filter(Boolean);
    return {
      cells: [
        d.label,
        DEVICE_KIND[d.kind] ?? d.kind,
        seg?.label ?? d.segmentId,
        num(seg?.designFlow, u.flow),
        r ? signed(-r.loss, u.pressure) : '—',
        notes.join('; '),
      ],
    };
  });
  if (deviceRows.length)
    L.table(
      [
        { header: 'Device', width: 28, wrap: true },
        { header: 'Kind', width: 16, wrap: true },
        { header: 'On segment', width: 14 },
        { header: `Flow (${u.flow})`, width: 10, align: 'right' },
        { header: `Change (${u.pressure})`, width: 11, align: 'right' },
        { header: 'Notes', width: 21, wrap: true },
      ],
      deviceRows,
      { continued: 'Devices' },
    );
  else L.paragraph('No in-line devices.');

  L.heading('Fixtures served', 2);
  const fixtureRows: { cells: string[] }[] = [];
  for (const n of doc.nodes) {
    for (const g of n.fixtureGroups) {
      const t = FIXTURE_TYPES[g.fixtureTypeId];
      const basis = g.wsfuBasis ?? a.service;
      const each = g.custom ? fixtureGroupWsfu(g, basis) : t ? (t.wsfu[basis] ?? t.wsfu.total) : null;
      const feed = nodeById.get(n.id)?.feedSegmentId;
      fixtureRows.push({
        cells: [
          n.label ?? n.id,
          g.custom ? fixtureGroupLabel(g) : (t?.label ?? g.fixtureTypeId),
          String(g.count),
          num(each, 'WSFU'),
          num(each === null ? null : each * g.count, 'WSFU'),
          t ? num(fromSI('flow', t.flowRateM3s, a.unitSystem), u.flow) : '—',
          feed ? num(segById.get(feed)?.designFlow, u.flow) : '—',
        ],
      });
    }
  }
  if (fixtureRows.length)
    L.table(
      [
        { header: 'Node', width: 20, wrap: true },
        { header: 'Fixture type', width: 28, wrap: true },
        { header: 'Count', width: 8, align: 'right' },
        { header: 'WSFU each', width: 10, align: 'right' },
        { header: 'WSFU', width: 9, align: 'right' },
        { header: `Flow each (${u.flow})`, width: 12, align: 'right' },
        { header: `Design flow to node (${u.flow})`, width: 13, align: 'right' },
      ],
      fixtureRows,
      { continued: 'Fixtures served' },
    );
  else L.paragraph('No fixture groups.');

  L.heading('Segments', 2);
  const basis = frictionBasis(a.unitSystem);
  L.paragraph(
    `Design flow and velocity are at the segment's design flow; Sum of K is the fittings' loss coefficients added up, referred to the segment's velocity (with any size change). Friction is the pipe friction loss of the segment at design flow, also per ${basis.label} of pipe; the fitting loss is from the Sum of K. Both are the analysis's own figures.`,
    { size: 8, color: COLORS.muted },
  );
  L.table(
    [
      { header: 'Segment', width: 11, wrap: true },
      { header: 'Material', width: 9, wrap: true },
      { header: 'Size', width: 4.5 },
      { header: `Inside dia. (${u.diameter})`, width: 5.5, align: 'right' },
      { header: `Length (${u.length})`, width: 5.5, align: 'right' },
      { header: `Rise (${u.elevation})`, width: 5, align: 'right' },
      { header: 'Fittings', width: 22, wrap: true },
      { header: 'Sum of K', width: 4.5, align: 'right' },
      { header: `Flow (${u.flow})`, width: 5.5, align: 'right' },
      { header: `Velocity (${u.velocity})`, width: 6.5, align: 'right' },
      { header: `Friction (${u.pressure})`, width: 6, align: 'right' },
      { header: `Friction (${u.pressure}/${basis.label})`, width: 6.5, align: 'right' },
      { header: `Fitting loss (${u.pressure})`, width: 6.5, align: 'right' },
    ],
    segmentRows(a, doc, names).map((r) => ({
      cells: [
        r.name,
        r.material,
        r.size,
        r.innerDiameter,
        r.length,
        r.rise,
        r.fittings,
        r.sumK,
        r.flow,
        `${r.velocity}${r.velocityOver ? ' over' : ''}`,
        r.frictionLoss,
        r.frictionGradient,
        r.fittingLoss,
      ],
      style: r.velocityOver ? { fail: true } : undefined,
    })),
    { continued: 'Segments', size: 6.5 },
  );
}

/** The results: every checked fixture, the critical ledger and profile, velocity, static pressure, warnings. */
function resultsSection(c: SummaryContext) {
  const { L, a, u, doc, P, critical, names } = c;
  const nodeLabel = names.node;
  const failingVelocity = a.segments.filter((s) => s.velocityPass === false);
  const failingStatic = a.nodes.filter((n) => n.staticPass === false);
  // ---- results
  L.heading('Results');
  L.heading('Checked fixtures', 2);
  const byMargin = [...a.fixtures].sort((x, y) => x.margin - y.margin);
  L.table(
    [
      { header: 'Fixture', width: 26, wrap: true },
      { header: 'Node', width: 16, wrap: true },
      { header: `Elevation (${u.elevation})`, width: 10, align: 'right' },
      { header: `Developed length (${u.length})`, width: 11, align: 'right' },
      { header: `Residual (${u.pressure})`, width: 10, align: 'right' },
      { header: `Required (${u.pressure})`, width: 10, align: 'right' },
      { header: `Margin (${u.pressure})`, width: 10, align: 'right' },
      { header: 'Result', width: 7 },
    ],
    byMargin.map((f) => ({
      cells: [
        f.id === a.criticalFixtureId ? `${f.label} (critical)` : f.label,
        nodeLabel(f.nodeId),
        num(f.elevation, u.elevation),
        num(f.developedLength, u.length),
        P(f.residual),
        P(f.required),
        signed(f.margin, u.pressure),
        f.pass ? 'pass' : 'FAIL',
      ],
      style: f.pass ? (f.id === a.criticalFixtureId ? { bold: true } : undefined) : { fail: true },
    })),
    { continued: 'Checked fixtures' },
  );

  if (critical) {
    const ledger = ledgerFor(a, critical.id);
    L.heading(`Pressure ledger to the critical fixture: ${critical.label}`, 2);
    L.table(
      [
        { header: '#', width: 6, align: 'right' },
        { header: 'Item', width: 58, wrap: true },
        { header: `Change (${u.pressure})`, width: 18, align: 'right' },
        { header: `Pressure after (${u.pressure})`, width: 18, align: 'right' },
      ],
      [
        ...ledger.lines.map((l) => ({
          cells: [String(l.step), ledgerLineLabel(l, a, names), l.kind === 'start' ? '' : signed(l.change, u.pressure), P(l.pressureAfter)],
        })),
        { cells: ['', 'Residual pressure at the fixture', '', P(ledger.residual)], style: { bold: true } },
        { cells: ['', 'Minimum flow pressure the fixture needs', '', P(ledger.required)] },
        {
          cells: ['', `Margin (${ledger.pass ? 'pass' : 'FAIL'})`, '', signed(ledger.margin, u.pressure)],
          style: ledger.pass ? { bold: true } : { fail: true, bold: true },
        },
      ],
      { continued: 'Pressure ledger' },
    );
    L.heading('Pressure profile along the path to the critical fixture', 2, 220);
    drawProfile(L, profilePoints(a, critical.id), {
      required: critical.required,
      pressureUnit: u.pressure,
      lengthUnit: u.length,
      fixtureLabel: critical.label,
    });
  }

  L.heading('Velocity check', 2);
  const limited = a.segments.filter((s) => s.velocityLimit !== null && s.velocityLimit > 0 && s.designFlow > 0);
  const ratio = (s: (typeof a.segments)[number]) => s.velocity / (s.velocityLimit as number);
  L.paragraph(
    failingVelocity.length
      ? `${failingVelocity.length} of ${limited.length} segments with a limit are above it at design flow.`
      : `All ${limited.length} segments with a limit are within it at design flow. The ones closest to their limit:`,
  );
  const velocityRows = (failingVelocity.length ? failingVelocity : [...limited].sort((x, y) => ratio(y) - ratio(x)).slice(0, 5)).map((s) => ({
    cells: [
      s.label ?? s.id,
      num(s.designFlow, u.flow),
      num(s.velocity, u.velocity),
      num(s.velocityLimit, u.velocity),
      `${Math.round(ratio(s) * 100)} %`,
      s.velocityPass === false ? 'FAIL' : 'pass',
    ],
    style: s.velocityPass === false ? { fail: true } : undefined,
  }));
  if (velocityRows.length)
    L.table(
      [
        { header: 'Segment', width: 34, wrap: true },
        { header: `Flow (${u.flow})`, width: 13, align: 'right' },
        { header: `Velocity (${u.velocity})`, width: 14, align: 'right' },
        { header: `Limit (${u.velocity})`, width: 14, align: 'right' },
        { header: 'Of limit', width: 12, align: 'right' },
        { header: 'Result', width: 13 },
      ],
      velocityRows,
      { continued: 'Velocity check' },
    );

  L.heading('Static pressure check', 2);
  const fixtureNodes = a.nodes.filter((n) => n.staticPass !== null);
  const highest = [...fixtureNodes].sort((x, y) => y.staticPressureHigh - x.staticPressureHigh)[0];
  L.paragraph(
    `Highest static pressure (source high static, less the climb, with PRVs and boosters applied) at a fixture node: ${highest ? `${withUnit(highest.staticPressureHigh, u.pressure)} at ${highest.label ?? highest.id}` : 'no fixture nodes'}; maximum ${withUnit(a.criteria.maxStaticPressure, u.pressure)}.`,
  );
  if (failingStatic.length)
    L.table(
      [
        { header: 'Node', width: 50, wrap: true },
        { header: `Static high (${u.pressure})`, width: 25, align: 'right' },
        { header: 'Result', width: 25 },
      ],
      failingStatic.map((n) => ({ cells: [n.label ?? n.id, P(n.staticPressureHigh), 'FAIL: above the maximum'], style: { fail: true } })),
      { continued: 'Static pressure check' },
    );
  worstCaseStatic(L, a);

  L.heading('Warnings', 2);
  if (a.warnings.length)
    L.table(
      [
        { header: 'Kind', width: 11 },
        { header: 'What', width: 52, wrap: true },
        { header: 'Where', width: 37, wrap: true },
      ],
      groupedWarningRows(a, doc).map((w) => ({
        cells: [SEVERITY[w.severity] ?? w.severity, w.what, w.where],
        style: w.severity === 'fail' ? { fail: true } : undefined,
      })),
      { continued: 'Warnings' },
    );
  else L.paragraph('No warnings.');
}

/** The pressure zones: the supply's and each one fed through a PRV or booster, with its checks and verdict. */
function zonesSection(c: SummaryContext) {
  const { L, u } = c;
  const rows = zoneRows(c.a);
  if (!rows.length) return; // an analysis stored before zones existed
  L.heading('Pressure zones', 2, 120);
  L.paragraph(
    rows.length === 1
      ? 'No pressure-reducing valve or booster pump: the whole system is one zone, fed from the supply.'
      : `${rows.length} zones: the part fed from the supply, and each part fed through a pressure-reducing valve or booster pump at its own setting (a zone inside another is fed from it). Pressures in ${u.pressure}; static against the maximum at the nodes that serve fixtures.`,
    { size: 8.5 },
  );
  L.table(
    [
      { header: 'Zone', width: 16, wrap: true },
      { header: 'Fed by; floors', width: 14, wrap: true },
      { header: 'Highest / lowest residual', width: 18, wrap: true },
      { header: 'Highest static', width: 18, wrap: true },
      { header: 'Critical fixture', width: 14, wrap: true },
      { header: 'Verdict', width: 20, wrap: true },
    ],
    rows.map((r) => ({
      cells: [r.name, `${r.fedBy}; ${r.floors}`, `${r.highestResidual} / ${r.lowestResidual}`, r.highestStatic, r.critical, r.verdict],
      style: r.status === 'fail' ? { fail: true } : undefined,
    })),
    { continued: 'Pressure zones' },
  );
}

/** The cautions printed in every summary, and the unverified-values note where it applies. */
function cautionsSection(c: SummaryContext) {
  const { L, a, catalogRows } = c;
  // ---- cautions, signature, input hash
  L.heading('Cautions', 1, 120);
  for (const c of SUMMARY_CAUTIONS) L.paragraph(`•  ${c}`, { indent: 0, after: 4 });
  if (catalogRows.some((r) => !r.verified) || Object.values(a.methods).some((m) => isUnverified(m.source, m as { verified?: boolean }))) {
    L.paragraph(
      `•  Some values used here are marked "${UNVERIFIED_NOTE}": they could not be checked against a printed copy of their code, standard or table. Confirm each against the adopted edition before relying on this check.`,
      { indent: 0, after: 4, font: 'bold' },
    );
  }
}

/** The preparer: the attestation recorded at issue, the signature field and the input hash. */
function preparerSection(c: SummaryContext) {
  const { L, header, input } = c;
  L.heading('Preparer and attestation', 1, 230);
  const att = attestationLines(input.attestation);
  L.paragraph(att.recorded ? 'Attestation' : 'Attestation not recorded', { font: 'bold', size: 9, after: 1 });
  for (const line of att.lines) L.paragraph(line, { size: 9, after: 2, ...(att.recorded ? {} : { color: COLORS.fail }) });
  L.gap(4);
  signatureBlock(c);
  L.heading('Input hash', 2, 40);
  L.paragraph("SHA-256 of the revision's inputs (canonical JSON); the same hash means the same inputs.", { size: 8, color: COLORS.muted });
  L.paragraph(header.inputHash, { font: 'bold', size: 8.5 });
}

/**
 * Appendix: the pressure ledger of every other checked fixture, one row per segment of its path;
 * rows shared with the ledger printed just before are not repeated (the row "carried from" names
 * where they are). The critical fixture's full ledger is in the results.
 */
function ledgerAppendix(c: SummaryContext) {
  const { L, a, doc, u, names } = c;
  const ledgers = fixtureLedgers(a, doc, { exclude: a.criticalFixtureId, names });
  if (!ledgers.length) return;
  if (!L.atPageTop) L.newPage();
  L.heading('Appendix: the pressure ledger of every checked fixture');
  L.paragraph(
    `Each ledger starts at the source and deducts, segment by segment along the path to the fixture, the device losses, pipe friction, fittings and elevation (${u.pressure}). Fixtures are in the order of the piping: where a ledger shares its start with the one before, it carries on from the pressure after the last shared segment. The critical fixture's ledger is under Results.`,
    { size: 8, color: COLORS.muted },
  );
  const rows: { cells: string[]; style?: { bold?: boolean; fail?: boolean } }[] = [];
  for (const l of ledgers) {
    rows.push({
      cells: [l.title, `${l.pass ? 'passes' : 'FAILS'}: residual ${l.residual}, required ${l.required}`, '', '', 'margin', l.margin],
      style: l.pass ? { bold: true } : { bold: true, fail: true },
    });
    if (l.carried) rows.push({ cells: [`carried from the ledger of ${l.carried.from}, after ${l.carried.after}`, '', '', '', '', l.carried.pressure] });
    else if (l.start) rows.push({ cells: [l.start, '', '', '', '', ''] });
    for (const r of l.rows) rows.push({ cells: [r.segment, r.devices, r.friction, r.fittings, r.elevation, r.pressureAfter] });
  }
  L.table(
    [
      { header: 'Fixture; segment on its path', width: 36, wrap: true },
      { header: 'Devices', width: 22, wrap: true },
      { header: `Friction (${u.pressure})`, width: 10, align: 'right' },
      { header: `Fittings (${u.pressure})`, width: 10, align: 'right' },
      { header: `Elevation (${u.pressure})`, width: 11, align: 'right' },
      { header: `Pressure after (${u.pressure})`, width: 11, align: 'right' },
    ],
    rows,
    { continued: 'Pressure ledgers', size: 6.5 },
  );
}

/** A ledger line's words with the segment named as the user typed it (the engine's line falls back to the id). */
function ledgerLineLabel(l: LedgerLine, a: Analysis, names: Names): string {
  if (!l.segmentId || l.kind === 'device') return l.label;
  const seg = a.segments.find((s) => s.id === l.segmentId);
  const engineName = seg?.label ?? l.segmentId;
  return l.label.startsWith(`${engineName}:`) ? `${names.segment(l.segmentId)}${l.label.slice(engineName.length)}` : l.label;
}

/** Who proposed the field change this revision came from, what it changed, and when it was accepted. */
function fieldChangeSection(L: Layout, fc: FieldChangeRecord) {
  L.heading('Field change in this revision', 2);
  L.keyValues([
    ['Field change', `${fc.number}: ${fc.title} (on revision ${fc.baseRevisionNumber})`],
    ['Proposed by', `${fc.proposedBy.name}${fc.proposedBy.email ? ` <${fc.proposedBy.email}>` : ''}, ${utc(fc.proposedAt)}`],
    ['Accepted by', `${fc.acceptedBy.name}${fc.acceptedBy.email ? ` <${fc.acceptedBy.email}>` : ''}, ${utc(fc.acceptedAt)}`],
    ...(fc.comment ? ([['Designer’s note', fc.comment]] as [string, string][]) : []),
  ]);
  L.table(
    [
      { header: 'Element', width: 24, wrap: true },
      { header: 'What changed', width: 76, wrap: true },
    ],
    fc.changes.map((c) => ({
      cells: [
        `${c.elementType === 'segment' ? 'Segment' : 'Device'} ${c.label}`,
        c.change === 'changed' ? c.fields.map((f) => `${f.field}: ${f.before ?? 'none'} → ${f.after ?? 'none'}`).join('; ') : c.text,
      ],
    })),
    { continued: 'Field change in this revision' },
  );
}

function verdictBox(L: Layout, title: string, lines: string[], fail: boolean) {
  const size = 9;
  const leading = size * 1.4;
  const wrapped = lines.flatMap((l) => L.wrap(L.clean(l), L.fonts.regular, size, L.contentWidth - 20));
  const height = 22 + wrapped.length * leading + 8;
  L.ensure(height + 6);
  L.gap(6);
  L.page.drawRectangle({
    x: L.left,
    y: L.y - height,
    width: L.contentWidth,
    height,
    color: fail ? COLORS.failBand : COLORS.band,
    borderColor: fail ? COLORS.fail : COLORS.accent,
    borderWidth: 0.8,
  });
  L.draw(title, L.left + 10, L.y - 16, { font: 'bold', size: 10.5, color: fail ? COLORS.fail : COLORS.accent });
  wrapped.forEach((line, i) => L.draw(line, L.left + 10, L.y - 22 - (i + 1) * leading + 3, { size }));
  L.gap(height + 4);
}

/** The name of the empty signature field, as a PDF reader lists it. */
export const SIGNATURE_FIELD_NAME = 'Preparer signature';

/**
 * The preparer's block: name, licence, the date of the attestation, an empty digital-signature
 * field (AcroForm /FT /Sig) the preparer signs in a PDF reader with their own certificate (Headroom
 * holds none), and room for a seal.
 */
function signatureBlock(c: SummaryContext) {
  const { L, header, input } = c;
  const height = 120;
  L.ensure(height + 10);
  const top = L.y - 4;
  const sealW = 130;
  const w = L.contentWidth - sealW - 12;
  const licence = input.attestation?.licenceNumber ?? header.permit?.preparerLicence ?? '';
  const rows: [string, string][] = [
    ['Prepared by', input.attestation?.name ?? header.preparerName],
    ['Digital signature', ''],
    ['Date of attestation', input.attestation ? utc(input.attestation.at) : ''],
    ['Licence or registration no.', [licence, header.permit?.licenceJurisdiction].filter(Boolean).join(', ')],
  ];
  const rowH = height / rows.length;
  rows.forEach(([label, value], i) => {
    const y = top - (i + 1) * rowH;
    L.page.drawLine({ start: { x: L.left, y }, end: { x: L.left + w, y }, thickness: 0.6, color: COLORS.muted });
    L.draw(label, L.left, y + 4, { size: 7.5, color: COLORS.muted });
    if (value) L.draw(L.fit(L.clean(value), L.fonts.regular, 10, w - 140), L.left + 130, y + 4, { size: 10 });
  });
  // the signature row's box, right of its label: the field's widget
  const sigRect = { x: L.left + 128, y: top - 2 * rowH + 1, width: w - 130, height: rowH - 2 };
  L.page.drawRectangle({ ...sigRect, borderColor: COLORS.rule, borderWidth: 0.5 });
  L.draw('sign here with your own certificate in a PDF reader', sigRect.x + 4, sigRect.y + sigRect.height - 9, { size: 6.5, color: COLORS.muted });
  addSignatureField(c, sigRect);
  L.page.drawRectangle({ x: L.left + w + 12, y: top - height, width: sealW, height, borderColor: COLORS.muted, borderWidth: 0.6, borderDashArray: [3, 2] });
  L.draw('Seal (where required)', L.left + w + 20, top - 14, { size: 7.5, color: COLORS.muted });
  L.gap(height + 12);
}

/** An unsigned signature field (ISO 32000-1, 12.7.4.5) with its widget on the current page. */
function addSignatureField(c: SummaryContext, rect: { x: number; y: number; width: number; height: number }) {
  const { pdf, L } = c;
  const ctx = pdf.context;
  const field = ctx.obj({
    FT: 'Sig',
    T: PDFString.of(SIGNATURE_FIELD_NAME),
    TU: PDFString.of('Signature of the preparer of this calculation'),
    Type: 'Annot',
    Subtype: 'Widget',
    Rect: [rect.x, rect.y, rect.x + rect.width, rect.y + rect.height],
    // print flag (bit 3): the widget prints with the page
    F: 4,
    P: L.page.ref,
  });
  const ref = ctx.register(field);
  L.page.node.addAnnot(ref);
  const form = pdf.catalog.getOrCreateAcroForm();
  form.addField(ref);
  // SignaturesExist (bit 1): readers offer the signing tools
  form.dict.set(PDFName.of('SigFlags'), PDFNumber.of(1));
}

/** The worst cases of static pressure: boosters at shutoff, each PRV failing open, pipe ratings, minimum static at the top. */
function worstCaseStatic(L: Layout, a: Analysis) {
  const c = staticCheckContent(a);
  const u = a.units;
  if (!c) {
    L.paragraph(
      'This revision was analysed before Headroom checked the worst cases of static pressure (boosters at shutoff, a PRV failing open, pipe ratings); they are not part of it.',
      { size: 8.5, color: COLORS.muted },
    );
    return;
  }
  if (c.boosters.length) {
    L.heading('Booster pumps: the basis of the static check', 2);
    L.table(
      [
        { header: 'Booster', width: 30, wrap: true },
        { header: 'Control', width: 14 },
        { header: `Design gain (${u.pressure})`, width: 12, align: 'right' },
        { header: `Shutoff gain (${u.pressure})`, width: 12, align: 'right' },
        { header: 'Static check', width: 32, wrap: true },
      ],
      c.boosters.map((b) => ({ cells: b.cells, style: b.fail ? { fail: true } : undefined })),
      { continued: 'Booster pumps' },
    );
  }
  if (c.prvFailOpen.length) {
    L.heading('If a pressure-reducing valve fails open', 2);
    for (const r of c.prvFailOpen)
      L.paragraph(`${r.caution ? 'Caution: ' : ''}${r.text}`, { indent: 0, after: 4, ...(r.caution ? { font: 'bold' as const, color: COLORS.fail } : {}) });
  }
  if (c.pipeRatings.length) {
    L.heading('Pipe pressure ratings against the highest static pressure', 2);
    L.table(
      [
        { header: 'Segment', width: 18, wrap: true },
        { header: 'Material', width: 16, wrap: true },
        { header: `Rating (${u.pressure})`, width: 10, align: 'right' },
        { header: `Highest static (${u.pressure})`, width: 11, align: 'right' },
        { header: 'Source', width: 38, wrap: true },
        { header: 'Result', width: 7 },
      ],
      c.pipeRatings.map((r) => ({ cells: r.cells, style: r.fail ? { fail: true } : undefined })),
      { continued: 'Pipe pressure ratings' },
    );
  }
  L.paragraph(c.minStatic, c.minStaticFail ? { font: 'bold', color: COLORS.fail } : {});
}
