/**
 * The side by side of a field change: two independent engine runs, one on the issued document and
 * one on the field change's, compared fixture by fixture, segment by segment and device by device,
 * with an overall verdict in one sentence and the warnings the change brings.
 */
import { safeAnalyzeSystem, UNIT_LABELS, type Analysis, type EngineWarning, type SystemDocument } from '../../src/engine';
import { num } from '../../src/shared/format/quantity';
import type { ChangeItem, ComparisonResponse } from '../../src/shared/api/fieldChanges';

type Comparison = Omit<ComparisonResponse, 'fieldChangeId' | 'baseRevision'>;

const run = (doc: SystemDocument) => {
  const r = safeAnalyzeSystem(doc);
  return r.ok ? { analysis: r.analysis, error: null } : { analysis: null, error: r.error.message };
};

const allPass = (a: Analysis) => a.verdict.allFixturesPass && a.verdict.allVelocitiesPass && a.verdict.allStaticPass;
const smallest = (a: Analysis) => a.fixtures.find((f) => f.id === a.criticalFixtureId) ?? null;

/** "still passes; the smallest margin falls from X to Y at fixture Z" or "fails at fixture Z by W". */
function verdictSentence(issued: Analysis | null, proposed: Analysis, unit: string): string {
  const P = (v: number) => `${num(v, unit)} ${unit}`;
  const now = smallest(proposed);
  const before = issued ? smallest(issued) : null;
  const failingFixtures = [...proposed.fixtures].filter((f) => !f.pass).sort((x, y) => x.margin - y.margin);
  const parts: string[] = [];
  if (failingFixtures.length) {
    const worst = failingFixtures[0];
    parts.push(
      `Fails at ${worst.label} by ${P(-worst.margin)}${failingFixtures.length > 1 ? ` (and ${failingFixtures.length - 1} more checked fixture${failingFixtures.length > 2 ? 's' : ''} fall short)` : ''}`,
    );
  }
  const fastSegments = proposed.segments.filter((s) => s.velocityPass === false);
  if (fastSegments.length) {
    const s = fastSegments[0];
    const u = proposed.units.velocity;
    parts.push(
      `${parts.length ? 'and' : 'Fails:'} segment ${s.label ?? s.id} runs at ${num(s.velocity, u)} ${u}, above its limit of ${num(s.velocityLimit, u)} ${u}${fastSegments.length > 1 ? ` (${fastSegments.length - 1} more segment(s) over their limit)` : ''}`,
    );
  }
  const highStatic = proposed.nodes.filter((n) => n.staticPass === false);
  if (highStatic.length)
    parts.push(
      `${parts.length ? 'and' : 'Fails:'} the static pressure at ${highStatic[0].label ?? highStatic[0].id} is ${P(highStatic[0].staticPressureHigh)}, above the maximum of ${P(proposed.criteria.maxStaticPressure)}`,
    );
  if (parts.length) return `${parts.join(' ')}.`;
  if (!now) return 'Still passes; the system has no checked fixtures, so no margin was compared.';
  if (!before) return `Passes; the smallest margin is ${P(now.margin)} at ${now.label}.`;
  const same = num(before.margin, unit) === num(now.margin, unit);
  const where = before.id === now.id ? `at ${now.label}` : `at ${now.label} (it was at ${before.label})`;
  if (same) return `Still passes; the smallest margin stays at ${P(now.margin)} ${where}.`;
  return `Still passes; the smallest margin ${now.margin < before.margin ? 'falls' : 'rises'} from ${P(before.margin)} to ${P(now.margin)} ${where}.`;
}

/** A warning per element it names (a grouped note stands for each of its elements). */
function warningKeys(ws: EngineWarning[]): Map<string, { w: EngineWarning; elementId: string | null }> {
  const out = new Map<string, { w: EngineWarning; elementId: string | null }>();
  for (const w of ws) for (const id of w.elementIds ?? [w.elementId]) out.set(`${w.code}|${w.elementType}|${id ?? ''}`, { w, elementId: id });
  return out;
}
const warningOut = ({ w, elementId }: { w: EngineWarning; elementId: string | null }) => ({
  code: w.code,
  severity: w.severity,
  message: w.message,
  elementType: w.elementType,
  elementId,
  detail: w.elementIds ? null : (w.detail ?? null),
});

const segmentNumbers = (a: Analysis | null, id: string) => {
  const s = a?.segments.find((x) => x.id === id);
  return s
    ? {
        frictionLoss: s.frictionLoss,
        fittingLoss: s.fittingLoss,
        loss: s.frictionLoss + s.fittingLoss,
        velocity: s.velocity,
        velocityPass: s.velocityPass,
        designFlow: s.designFlow,
      }
    : null;
};
const deviceLoss = (a: Analysis | null, id: string) => {
  for (const s of a?.segments ?? []) for (const d of s.devices) if (d.deviceId === id) return d.loss;
  return null;
};
const diff = (a: number | null | undefined, b: number | null | undefined) => (a === null || a === undefined || b === null || b === undefined ? null : b - a);

export function compareDocuments(issuedDoc: SystemDocument, proposedDoc: SystemDocument, changes: ChangeItem[]): Comparison {
  const issued = run(issuedDoc);
  const proposed = run(proposedDoc);
  const u = UNIT_LABELS[proposedDoc.unitSystem];
  const a = issued.analysis;
  const b = proposed.analysis;

  const ids = [...new Set([...(a?.fixtures ?? []).map((f) => f.id), ...(b?.fixtures ?? []).map((f) => f.id)])];
  const fixtures = ids.map((id) => {
    const x = a?.fixtures.find((f) => f.id === id);
    const y = b?.fixtures.find((f) => f.id === id);
    return {
      id,
      label: y?.label ?? x?.label ?? id,
      nodeId: y?.nodeId ?? x?.nodeId ?? '',
      required: y?.required ?? x?.required ?? null,
      issuedResidual: x?.residual ?? null,
      newResidual: y?.residual ?? null,
      issuedMargin: x?.margin ?? null,
      newMargin: y?.margin ?? null,
      difference: diff(x?.margin, y?.margin),
      issuedPass: x?.pass ?? null,
      newPass: y?.pass ?? null,
    };
  });

  const segments = changes
    .filter((c) => c.elementType === 'segment')
    .map((c) => {
      const before = segmentNumbers(a, c.elementId);
      const after = segmentNumbers(b, c.elementId);
      return {
        id: c.elementId,
        label: c.label,
        changes: c.fields,
        issued: before,
        proposed: after,
        lossDifference: diff(before?.loss, after?.loss),
        velocityDifference: diff(before?.velocity, after?.velocity),
      };
    });
  const devices = changes
    .filter((c) => c.elementType === 'device')
    .map((c) => {
      const before = deviceLoss(a, c.elementId);
      const after = deviceLoss(b, c.elementId);
      return { id: c.elementId, label: c.label, change: c.change, changes: c.fields, issuedLoss: before, newLoss: after, lossDifference: diff(before, after) };
    });

  const wa = warningKeys(a?.warnings ?? []);
  const wb = warningKeys(b?.warnings ?? []);
  const newWarnings = [...wb].filter(([k]) => !wa.has(k)).map(([, v]) => warningOut(v));
  const resolvedWarnings = [...wa].filter(([k]) => !wb.has(k)).map(([, v]) => warningOut(v));

  const critical = b ? smallest(b) : null;
  const issuedCritical = a ? smallest(a) : null;
  return {
    units: { pressure: u.pressure, velocity: u.velocity, length: u.length, flow: u.flow },
    issued: { ok: !!a, error: issued.error },
    proposed: { ok: !!b, error: proposed.error },
    verdict: {
      pass: b ? allPass(b) : null,
      sentence: b ? verdictSentence(a, b, u.pressure) : `The field change cannot be computed: ${proposed.error}`,
      criticalFixtureId: critical?.id ?? null,
      issuedSmallestMargin: issuedCritical?.margin ?? null,
      newSmallestMargin: critical?.margin ?? null,
    },
    fixtures,
    segments,
    devices,
    newWarnings,
    resolvedWarnings,
  };
}
