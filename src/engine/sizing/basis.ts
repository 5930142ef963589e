/**
 * The record of an applied automatic sizing (the document's `sizingBasis`) and how the summary and
 * the result step state it: what the sizing was asked to meet, when, on which segments, and
 * whether the sizes are still the ones it chose. The record is written in the document's units, as
 * every other number of the document is; the fingerprint covers each segment's material and size,
 * so any later change of a pipe (by hand, a field change or another tool) is told apart.
 */
import type { SizingBasis, SystemDocument } from '../model/schema';
import { fromSI, UNIT_LABELS } from '../units';
import { unitTypeSegmentKey, type SizingResult } from './sizeSystem';

/**
 * A fingerprint of every segment's pipe (id, material, size, in id order; a unit type's segments
 * by "<unit type id>/<segment id>", present only in a document with unit types): two 32-bit FNV-1a
 * hashes with different offset bases, as 16 hex digits. FNV-1a is a published, non-cryptographic
 * hash (Fowler, Noll and Vo; offset basis 2166136261 and prime 16777619 for 32 bits); it detects
 * edits, it does not protect against a forger.
 */
export function sizesFingerprint(doc: Pick<SystemDocument, 'segments'> & Partial<Pick<SystemDocument, 'unitTypes'>>): string {
  const unitSegments = (doc.unitTypes ?? []).flatMap((t) => t.segments.map((s) => ({ ...s, id: unitTypeSegmentKey(t.id, s.id) })));
  const text = [...doc.segments, ...unitSegments]
    .map((s) => `${s.id}\u0000${s.material ?? ''}\u0000${s.size ?? ''}`)
    .sort()
    .join('\u0001');
  // 0x811c9dc5 (2166136261): the FNV-1a 32-bit offset basis; the second basis is the first with
  // its 16-bit halves swapped (our choice), so the pair behaves as a 64-bit fingerprint.
  return fnv1a(text, 0x811c9dc5) + fnv1a(text, 0x9dc5811c);
}

function fnv1a(text: string, basis: number): string {
  let h = basis >>> 0;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    // 16777619: the FNV 32-bit prime
    h = Math.imul(h, 16777619) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

export interface SizingBasisInput {
  /** The document after the sizes were applied. */
  sized: SystemDocument;
  result: SizingResult;
  marginPa: number;
  scope: SizingBasis['scope'];
  /** When it was applied. */
  at: Date;
}

/** The record to store with the sized document (document units). */
export function sizingBasisOf({ sized, result, marginPa, scope, at }: SizingBasisInput): SizingBasis {
  const sys = sized.unitSystem;
  return {
    sizedAt: at.toISOString(),
    scope,
    margin: fromSI('pressure', marginPa, sys),
    supplyPressure: fromSI('pressure', result.conditions.supplyPressurePa, sys),
    velocityLimits: result.conditions.velocityLimits
      .filter(
        (v): v is { material: 'copper' | 'plastic' | 'steel'; maxVelocityMs: number } =>
          v.material === 'copper' || v.material === 'plastic' || v.material === 'steel',
      )
      .map((v) => ({ material: v.material, maxVelocity: fromSI('velocity', v.maxVelocityMs, sys) })),
    segmentsChanged: result.segments.filter((r) => r.after !== null && r.after !== r.before).length,
    segmentsLocked: result.segments.filter((r) => r.governing === 'locked').length,
    sizesFingerprint: sizesFingerprint(sized),
  };
}

export type SizingBasisState =
  | { kind: 'as-entered' }
  /** `edited`: some segment's material or size differs from what the sizing left. */
  | { kind: 'sized'; basis: SizingBasis; edited: boolean };

export function sizingBasisState(doc: SystemDocument): SizingBasisState {
  const basis = doc.sizingBasis;
  if (!basis) return { kind: 'as-entered' };
  return { kind: 'sized', basis, edited: sizesFingerprint(doc) !== basis.sizesFingerprint };
}

const CLASS_WORDS: Record<string, string> = { copper: 'copper', plastic: 'plastic', steel: 'steel' };

/** "2026-12-03 10:50 UTC" */
function utcMinute(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}

/**
 * The sizing basis in plain words, as the summary and the result step print it: who chose the
 * sizes and against what; where the pipes changed after the sizing, it says so.
 */
export function sizingBasisText(doc: SystemDocument): string {
  const state = sizingBasisState(doc);
  if (state.kind === 'as-entered') return 'Sizes as entered by the designer (no automatic sizing is recorded for this revision).';
  const b = state.basis;
  const u = UNIT_LABELS[doc.unitSystem];
  const p = (x: number) => `${x.toFixed(2)} ${u.pressure}`;
  const limits = b.velocityLimits.length
    ? b.velocityLimits.map((v) => `${v.maxVelocity.toFixed(1)} ${u.velocity} in ${CLASS_WORDS[v.material] ?? v.material} pipe`).join(', ')
    : 'no limit set';
  const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  const words = [
    `Sizes chosen by Headroom's automatic sizing on ${utcMinute(b.sizedAt)}, ${b.scope === 'system' ? 'for the whole system' : 'for a selection of segments'}:`,
    `the smallest catalog size of each segment's material that keeps velocity at or under its limit (${limits})`,
    `and every checked fixture at or above its minimum flow pressure plus a margin of ${p(b.margin)},`,
    `at the minimum supply pressure of ${p(b.supplyPressure)} at the design flow;`,
    `${plural(b.segmentsChanged, 'segment', 'segments')} changed size and ${plural(b.segmentsLocked, 'segment was', 'segments were')} kept at ${b.segmentsLocked === 1 ? 'its' : 'their'} locked size.`,
  ];
  if (state.edited)
    words.push(
      'Pipe sizes or materials have been edited since that sizing, so some sizes may not be the ones it chose; the checks in this summary are of the sizes as they are now.',
    );
  return words.join(' ');
}
