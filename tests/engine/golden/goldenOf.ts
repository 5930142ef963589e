import { analyzeSystem } from '../../../src/engine';

/** The numbers of an analysis that the golden files pin (SI, as computed: no display rounding). */
export function goldenOf(document: unknown) {
  const a = analyzeSystem(document);
  return {
    engineVersion: a.engineVersion,
    verdict: a.verdict.status,
    incomplete: a.verdict.incomplete.map((r) => r.code),
    criticalFixtureId: a.criticalFixtureId,
    warnings: a.warnings.map((w) => `${w.code} ${w.elementType} ${w.elementId ?? ''}`),
    fixtures: a.si.fixtures.map((f) => ({ id: f.id, residual: f.residual, margin: f.margin, pass: f.pass })),
    segments: a.si.segments.map((s) => ({
      id: s.id,
      designFlow: s.designFlow,
      velocity: s.velocity,
      frictionLoss: s.frictionLoss,
      fittingLoss: s.fittingLoss,
      riseLoss: s.riseLoss,
      deviceLoss: s.deviceLoss,
    })),
  };
}
