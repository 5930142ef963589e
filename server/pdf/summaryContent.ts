/**
 * What the issued summary says, decided apart from how it is drawn: the verdict with its first
 * line, where each source string comes from (the data the analysis used, never text written
 * here), the worst-case static results, and the names of the elements a warning is about.
 * Pure functions over the stored document and analysis; summaryPdf.ts only draws what they return.
 */
import { groupWarnings, verdictStatus, type Analysis, type StaticChecks, type SystemDocument } from '../../src/engine';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { MATERIALS } from '../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import type { EngineWarning } from '../../src/engine/warnings';
import { NOT_VERIFIED } from '../../src/engine/catalog/notVerified';
import { num, signed, withUnit } from '../../src/shared/format/quantity';
import { utc } from './format';

/** Printed beside every value whose source is not verified against the printed code (the catalog's own words). */
export const UNVERIFIED_NOTE = NOT_VERIFIED;

/** The designer's acknowledgement of a failing verdict, recorded at issue. */
export interface FailureAcknowledgementText {
  statement: string;
  by: string | null;
  at: string;
}

export interface SummaryVerdict {
  status: 'pass' | 'fail';
  /** The summary's first line: starts with PASS or FAIL. */
  headline: string;
  /** One word for every page's header. */
  word: 'PASS' | 'FAIL';
  lines: string[];
  /** For a failing revision: the acknowledgement as printed (or that none was recorded). */
  acknowledgement: string | null;
}

/** Thrown for a revision whose analysis is incomplete: it never gets a summary. */
export class IncompleteSummaryError extends Error {
  constructor(readonly reasons: { code: string; message: string }[]) {
    super(`an incomplete revision has no summary (${reasons.map((r) => r.message).join('; ') || 'no checked fixture'})`);
  }
}

/**
 * The verdict as the summary states it. "every check is met" only when the status is pass; a
 * failing revision says FAIL first and prints the designer's acknowledgement; incomplete throws.
 */
export function summaryVerdict(a: Analysis, ack: FailureAcknowledgementText | null | undefined): SummaryVerdict {
  const status = verdictStatus(a);
  if (status === 'incomplete') throw new IncompleteSummaryError(a.verdict.incomplete ?? []);
  const u = a.units;
  const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId) ?? null;
  const failingFixtures = a.fixtures.filter((f) => !f.pass);
  const failingVelocity = a.segments.filter((s) => s.velocityPass === false);
  const failingStatic = a.nodes.filter((n) => n.staticPass === false);
  const failures = a.verdict.failures;
  const lines = [
    failingFixtures.length === 0
      ? `All ${a.fixtures.length} checked fixtures have at least their minimum flow pressure.`
      : `${failingFixtures.length} of ${a.fixtures.length} checked fixtures fall short of their minimum flow pressure.`,
    critical
      ? `Critical fixture (smallest margin): ${critical.label}, residual ${withUnit(critical.residual, u.pressure)}, required ${withUnit(critical.required, u.pressure)}, margin ${signed(critical.margin, u.pressure)} ${u.pressure}.`
      : 'No critical fixture.',
    failingVelocity.length
      ? `${plural(failingVelocity.length, 'segment is', 'segments are')} above the velocity limit.`
      : 'Every segment is within its velocity limit (where one applies).',
    failingStatic.length
      ? `${plural(failingStatic.length, 'node is', 'nodes are')} above the maximum static pressure.`
      : `Static pressure stays at or under ${withUnit(a.criteria.maxStaticPressure, u.pressure)} at every fixture node.`,
  ];
  if (status === 'pass') return { status, word: 'PASS', headline: 'PASS: every check is met', lines, acknowledgement: null };
  const acknowledgement = ack
    ? `Issued although it fails, with the designer's acknowledgement${ack.by ? ` (${ack.by}, ${utc(ack.at)})` : ` (${utc(ack.at)})`}: “${ack.statement}”`
    : 'Issued although it fails; no acknowledgement of the failure was recorded with this revision.';
  return {
    status,
    word: 'FAIL',
    headline: `FAIL: ${failures === 1 ? 'one check is' : `${failures} checks are`} not met`,
    lines,
    acknowledgement,
  };
}

/** "1 node is" / "3 nodes are". */
export function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** True when a source string or its entry says it was not checked against the printed code. */
export function isUnverified(source: string, entry?: { verified?: boolean }): boolean {
  return entry?.verified === false || source.includes(UNVERIFIED_NOTE) || /from memory/i.test(source);
}

/** A source as printed: the data's own words, with the unverified note added where the words lack it. */
export function sourceText(source: string, entry?: { verified?: boolean }): string {
  return isUnverified(source, entry) && !source.includes(UNVERIFIED_NOTE) ? `${source} (${UNVERIFIED_NOTE})` : source;
}

export interface SourceRow {
  kind: string;
  item: string;
  source: string;
  verified: boolean;
}

/** Every catalog entry the document uses (materials, fitting types, fixture types), with the entry's own sources. */
export function catalogSourcesUsed(doc: SystemDocument, fittingMethod?: string): SourceRow[] {
  const rows: SourceRow[] = [];
  const materials = new Set<string>();
  const fittings = new Set<string>();
  const fixtures = new Set<string>();
  for (const s of doc.segments) {
    if (s.material) materials.add(s.material);
    for (const f of s.fittings ?? []) if (!f.custom) fittings.add(f.typeId);
  }
  for (const n of doc.nodes) {
    for (const g of n.fixtureGroups ?? []) if (!g.custom) fixtures.add(g.fixtureTypeId);
    for (const c of n.checkedFixtures ?? []) fixtures.add(c.fixtureTypeId);
  }
  for (const id of [...materials].sort()) {
    const m = MATERIALS[id as keyof typeof MATERIALS];
    if (!m) continue;
    const unverified = new Set<string>(m.unverified ?? []);
    const datum = (key: string, words: string, source: string) => `${words}: ${sourceText(source, { verified: !unverified.has(key) })}`;
    const source = [
      datum('dimensions', 'inside diameters', m.dimensionSource),
      datum('roughness', 'roughness', m.roughnessSource),
      datum('hazenWilliamsC', 'Hazen–Williams C', m.hazenWilliamsSource),
    ].join('; ');
    rows.push({ kind: 'Pipe material', item: m.label, source, verified: m.verified !== false && unverified.size === 0 && !isUnverified(source) });
  }
  for (const id of [...fittings].sort()) {
    const f = FITTING_TYPES[id];
    if (!f) continue;
    // the sources of the fitting method used ("crane: …", "hooper-2k: …"), plus any not tied to one method
    const tagged = /^(crane|hooper-2k|darby-3k|equivalent-length):/;
    const used = fittingMethod ? f.sources.filter((x) => x.startsWith(`${fittingMethod}:`) || !tagged.test(x)) : f.sources;
    const lines = used.length ? used : f.sources;
    rows.push({ kind: 'Fitting type', item: f.label, source: lines.map((x) => sourceText(x)).join('; '), verified: !lines.some((x) => isUnverified(x)) });
  }
  for (const id of [...fixtures].sort()) {
    const t = FIXTURE_TYPES[id];
    if (!t) continue;
    rows.push({ kind: 'Fixture type', item: t.label, source: sourceText(t.source, t), verified: !isUnverified(t.source, t) });
  }
  return rows;
}

/** The worst-case static results (document units); absent from analyses stored before the engine made them. */
export const staticChecksOf = (a: Analysis): StaticChecks | null =>
  (a as Omit<Analysis, 'staticChecks'> & { staticChecks?: StaticChecks }).staticChecks ?? null;

/** The lines the summary prints for the worst-case static results; null when the analysis has none. */
export function staticCheckContent(a: Analysis) {
  const sc = staticChecksOf(a);
  if (!sc) return null;
  const p = a.units.pressure;
  const boosters = (sc.boosters ?? []).map((b) => ({
    cells: [
      b.label,
      b.control === 'variable-speed' ? 'variable speed' : 'constant speed',
      num(b.designGain, p),
      // a variable-speed pump holds its set discharge: it has no shutoff rise to add
      b.control === 'variable-speed' ? '—' : num(b.shutoffGain, p),
      b.control === 'variable-speed'
        ? 'static taken at the set discharge pressure'
        : b.assumed
          ? 'shutoff not stated: assumed equal to the design gain'
          : 'static taken at the shutoff gain (zero flow)',
    ],
    fail: b.assumed,
  }));
  const prvFailOpen = (sc.prvFailOpen ?? []).map((r) =>
    r.nodesOverMax > 0
      ? {
          text: `If ${r.label} fails open, ${plural(r.nodesOverMax, 'fixture node exceeds', 'fixture nodes exceed')} the maximum static pressure of ${withUnit(r.maxStaticPressure, p)}; the highest is ${r.worstNodeLabel ?? 'a fixture node'} at ${withUnit(r.worstStatic, p)} (${num(r.excess, p)} ${p} over).`,
          caution: true,
        }
      : {
          text: `If ${r.label} fails open, every fixture node stays at or under the maximum static pressure of ${withUnit(r.maxStaticPressure, p)} (highest ${withUnit(r.worstStatic, p)}).`,
          caution: false,
        },
  );
  const pipeRatings = (sc.pipeRatings ?? []).map((r) => ({
    cells: [r.label, r.materialLabel, num(r.ratingPressure, p), num(r.highestStatic, p), sourceText(r.source, r), r.pass ? 'pass' : 'FAIL'],
    fail: !r.pass,
  }));
  const m = sc.minStaticAtHighestFixture;
  const minStatic = m
    ? `Minimum static pressure at the highest checked fixture, ${m.label}: ${withUnit(m.staticLow, p)} at the source's low static; minimum ${withUnit(m.minimum, p)}: ${m.pass ? 'pass' : 'FAIL'}.`
    : 'Minimum static pressure at the highest checked fixture: no minimum static pressure is set, so it is not checked.';
  return { boosters, prvFailOpen, pipeRatings, minStatic, minStaticFail: m ? !m.pass : false };
}

/**
 * Where a warning applies, in the names the user typed: the warning's own `elementLabel` when the
 * engine gives one, else the label of the element it names; never an internal id on its own.
 */
export function warningWhere(w: EngineWarning & { elementLabel?: string | null }, a: Analysis, doc: SystemDocument): string {
  const name = (type: string, id: string): string => {
    if (type === 'segment') {
      const s = a.segments.find((x) => x.id === id);
      if (s?.label) return s.label;
      const d = doc.segments.find((x) => x.id === id);
      const from = d ? nodeName(a, doc, d.from) : null;
      const to = d ? nodeName(a, doc, d.to) : null;
      return from && to ? `pipe from ${from} to ${to}` : 'a segment';
    }
    // a fitting's warning names the segment that carries it (the engine gives the segment's id)
    if (type === 'fitting')
      return a.segments.some((x) => x.id === id) || doc.segments.some((x) => x.id === id) ? `fittings on ${name('segment', id)}` : 'a fitting';
    if (type === 'node') return nodeName(a, doc, id) ?? 'a node';
    if (type === 'device') return doc.devices.find((x) => x.id === id)?.label ?? 'a device';
    if (type === 'checked-fixture') return a.fixtures.find((x) => x.id === id)?.label ?? 'a checked fixture';
    if (type === 'source') return `the source${nodeName(a, doc, doc.source.nodeId) ? ` at ${nodeName(a, doc, doc.source.nodeId)}` : ''}`;
    return type === 'system' ? 'the whole system' : `a ${type}`;
  };
  const ids = w.elementIds ?? (w.elementId ? [w.elementId] : []);
  if (ids.length > 1) {
    const names = ids.slice(0, 6).map((id) => name(w.elementType, id));
    return `${ids.length} ${w.elementType}s: ${names.join(', ')}${ids.length > 6 ? ', …' : ''}`;
  }
  if (w.elementLabel) return w.elementLabel;
  return ids.length ? name(w.elementType, ids[0]) : name(w.elementType, '');
}

function nodeName(a: Analysis, doc: SystemDocument, id: string): string | null {
  return a.nodes.find((n) => n.id === id)?.label ?? doc.nodes.find((n) => n.id === id)?.label ?? null;
}

/**
 * A hot system's source as the summary names it: the cold-water system and node feeding its heater,
 * and the figures read there (src/engine/hotWater/fedFrom.ts); null for a source not fed from a system.
 */
export function fedFromText(doc: SystemDocument, pressureUnit: string): string | null {
  const fedFrom = doc.source.fedFrom;
  if (!fedFrom) return null;
  const r = fedFrom.resolution;
  if (r?.status !== 'resolved') return `NOT READ — ${r?.message ?? 'the cold system has not been read'}`;
  const p = (x: number) => withUnit(x, pressureUnit);
  return `the cold-water system "${r.systemName}" at ${r.nodeLabel}, its revision ${r.revisionNumber} (${r.revisionStatus}): residual ${p(r.residualPressure)} at its design flow, high static ${p(r.staticPressureHigh)}. The water heater's loss is its device's, under Devices.`;
}

/** Warnings as the summary lists them: the same kind and words on several elements make one row naming them (up to 8, then a count); the grouping is the screens' too (groupWarnings). */
export function groupedWarningRows(a: Analysis, doc: SystemDocument): { severity: EngineWarning['severity']; what: string; where: string }[] {
  const groups = groupWarnings(a.warnings, (w) => warningWhere(w, a, doc));
  const SHOWN = 8;
  return groups.map((g) => ({
    severity: g.severity,
    what: g.what,
    where:
      g.wheres.length === 1
        ? g.wheres[0]
        : `${g.wheres.length} places: ${g.wheres.slice(0, SHOWN).join('; ')}${g.wheres.length > SHOWN ? `; and ${g.wheres.length - SHOWN} more` : ''}`,
  }));
}
