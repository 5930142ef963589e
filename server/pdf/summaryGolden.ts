/**
 * The summary model as plain text, for golden files (scripts/summary-golden.ts writes them,
 * tests/engine/summaryGolden.test.ts compares): what the PDF prints for the permit, the
 * attestation, every segment's losses, every fixture's ledger, the chart's ticks and the riser
 * diagram's elements, without the drawing. A change to any of them is a failing test until the
 * golden files are written again on purpose.
 */
import { ledgerFor, sizingBasisText } from '../../src/engine';
import type { SummaryPdfInput } from './summaryPdf';
import { summaryVerdict } from './summaryContent';
import { attestationLines, permitFrame, permitRows } from './permitContent';
import { fixtureLedgers, frictionBasis, namesOf, segmentRows, zoneRows } from './summaryTables';
import { num, signed } from '../../src/shared/format/quantity';
import { profileAxes, profilePoints } from './chart';
import { riserDiagram, riserElementsByFloor } from '../../src/shared/diagram/riserLayout';

export function summaryGoldenText(input: SummaryPdfInput, extra: ((input: SummaryPdfInput) => string[])[] = []): string {
  const { header, document: doc, analysis: a } = input;
  const u = a.units;
  const names = namesOf(a, doc);
  const out: string[] = [];
  const verdict = summaryVerdict(a, input.failureAcknowledgement);
  out.push(`# ${doc.name}`, '', verdict.headline, ...verdict.lines, '');

  out.push('## Permit', ...permitRows(header).map(([k, v]) => `${k}: ${v}`));
  const frame = permitFrame(header);
  out.push(`page header: ${frame.left} | ${frame.right}`, '');

  out.push('## Attestation', ...attestationLines(input.attestation).lines, '');

  out.push('## Sizing basis', sizingBasisText(doc), '');

  const basis = frictionBasis(a.unitSystem);
  out.push(`## Segments (flow ${u.flow}, velocity ${u.velocity}, friction ${u.pressure} and ${u.pressure}/${basis.label}, fitting loss ${u.pressure})`);
  for (const r of segmentRows(a, doc, names)) {
    out.push(
      `${r.name} | ${r.material} ${r.size} | flow ${r.flow} | velocity ${r.velocity}${r.velocityOver ? ' over' : ''} | sum K ${r.sumK} | friction ${r.frictionLoss} (${r.frictionGradient}/${basis.label}) | fittings ${r.fittingLoss}`,
    );
  }
  out.push('');

  const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId);
  if (critical) {
    const ledger = ledgerFor(a, critical.id);
    out.push(`## Ledger of the critical fixture: ${critical.label}`);
    for (const l of ledger.lines)
      out.push(
        `${l.step} ${l.kind} ${l.segmentId ? names.segment(l.segmentId) : ''} ${l.kind === 'device' || l.kind === 'start' ? l.label : ''} ${l.kind === 'start' ? '' : signed(l.change, u.pressure)} -> ${num(l.pressureAfter, u.pressure)}`.replace(
          /\s+/g,
          ' ',
        ),
      );
    out.push(`residual ${num(ledger.residual, u.pressure)}, required ${num(ledger.required, u.pressure)}, margin ${signed(ledger.margin, u.pressure)}`, '');
    const axes = profileAxes(profilePoints(a, critical.id), critical.required, u.pressure);
    out.push(`## Pressure profile to ${critical.label}`);
    out.push(`pressure ticks (${u.pressure}, step ${axes.y.step}): ${axes.y.ticks.map((t) => t.label).join(' ')}`);
    out.push(`length ticks (${u.length}, step ${axes.x.step}): ${axes.x.ticks.map((t) => t.label).join(' ')}`);
    for (const d of axes.devices) out.push(`device step at ${num(d.x, u.length)} ${u.length}: ${d.text}`);
    out.push('');
  }

  const zones = zoneRows(a);
  if (zones.length) {
    out.push(`## Pressure zones (${u.pressure})`);
    for (const z of zones)
      out.push(
        `${z.name} | fed by ${z.fedBy} | ${z.floors} | highest ${z.highestResidual} | lowest ${z.lowestResidual} | static ${z.highestStatic} | critical ${z.critical} | ${z.verdict}`,
      );
    out.push('');
  }

  out.push(`## Appendix: every other checked fixture's ledger (${u.pressure})`);
  for (const l of fixtureLedgers(a, doc, { exclude: a.criticalFixtureId, names })) {
    out.push(`### ${l.title}: residual ${l.residual}, required ${l.required}, margin ${l.margin} (${l.pass ? 'pass' : 'FAIL'})`);
    if (l.carried) out.push(`carried from ${l.carried.from} after ${l.carried.after}: ${l.carried.pressure}`);
    if (l.start) out.push(l.start);
    for (const r of l.rows)
      out.push(
        `${r.segment}${r.devices ? ` [${r.devices}]` : ''} friction ${r.friction} fittings ${r.fittings} elevation ${r.elevation} -> ${r.pressureAfter}`,
      );
  }
  out.push('');
  out.push('## Riser diagram', ...riserElementsByFloor(riserDiagram(doc, a)), '');
  for (const section of extra) out.push(...section(input), '');
  return out.join('\n').replace(/\n+$/, '\n');
}
