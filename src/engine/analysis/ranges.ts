/**
 * Validation of magnitudes: every numeric input of a parsed document against its plausible range
 * (model/limits.ts), in the document's own unit system. Which numbers have which range is read from
 * the document's description (model/elements.ts), through the checks generated from it
 * (ranges.generated.ts, rangesSource.ts): a key added there with a range is checked here without an
 * edit. The first value out of range becomes `value-out-of-range` naming the element and field, with
 * every such value in `issues` (at most MAX_RANGE_ISSUES, and a count of the rest). Runs before any
 * arithmetic, so a 1e308 ft length never reaches the hydraulics.
 */
import { EngineInputError, type EngineIssue } from '../errors';
import type { Obj } from '../model/describe';
import { checkRange } from '../model/limits';
import type { SystemDocument } from '../model/schema';
import { BOUNDS, type RangeContext } from './rangeContext';
import { checkSystemDocument } from './ranges.generated';
import type { ElementType } from '../errors';

/** Enough to show every slip of a hand-entered document; more only repeats one mistake. */
export const MAX_RANGE_ISSUES = 100;

/** The field as the message names it, from the element's own part of the path: "loss.points[0].flow", "minFlowPressures.wc". */
function fieldOf(parts: readonly (string | number)[], from: number): string {
  let field = '';
  for (let i = from; i < parts.length; i++) {
    const p = parts[i];
    field += typeof p === 'number' ? `[${p}]` : field === '' ? p : `.${p}`;
  }
  return field;
}

export function checkRanges(doc: SystemDocument): void {
  const sys = doc.unitSystem;
  const issues: EngineIssue[] = [];
  let more = 0;
  const c: RangeContext = {
    bounds: BOUNDS[sys],
    path: [],
    type: 'system',
    id: null,
    depth: 0,
    fail(quantity, key, value) {
      const problem = checkRange(quantity, value as number, sys);
      if (problem === null) return;
      if (issues.length >= MAX_RANGE_ISSUES) {
        more++;
        return;
      }
      const path = [...this.path, key];
      const field = fieldOf(path, this.depth);
      const { type: elementType, id: elementId } = this;
      const name = elementId === null ? undefined : labelOf(doc, elementType, elementId);
      const where = elementId ? `${elementType} "${name ?? elementId}"` : elementType;
      issues.push({ code: 'value-out-of-range', elementType, elementId, field, path, message: `${where}, field "${field}": ${String(value)} — ${problem}` });
    },
  };
  checkSystemDocument(doc as unknown as Obj, c);

  if (issues.length > 0) {
    const first = issues[0];
    const extra = more > 0 ? ` (${issues.length + more} values out of range; the first ${issues.length} are listed)` : '';
    throw new EngineInputError({
      code: 'value-out-of-range',
      elementType: first.elementType,
      elementId: first.elementId,
      field: first.field,
      message: first.message + extra,
      issues,
    });
  }
}

/** The name the user typed for an element, for the message (the id stays in elementId). */
function labelOf(doc: SystemDocument, elementType: ElementType, elementId: string): string | undefined {
  switch (elementType) {
    case 'segment':
    case 'fitting':
      return doc.segments.find((s) => s.id === elementId)?.label || undefined;
    case 'node':
    case 'fixture-group':
      return doc.nodes.find((n) => n.id === elementId)?.label || undefined;
    case 'device':
      return doc.devices.find((d) => d.id === elementId)?.label || undefined;
    case 'floor':
      return doc.floors.find((f) => f.id === elementId)?.name || undefined;
    case 'checked-fixture':
      for (const n of doc.nodes) for (const f of n.checkedFixtures) if (f.id === elementId) return f.label || undefined;
      return undefined;
    default:
      return undefined;
  }
}
