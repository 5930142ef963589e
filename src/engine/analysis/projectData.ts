/**
 * The note that a document uses the project's own data instead of the seeded catalogs: one note
 * for fittings and one for fixture groups, however many use it (a 5,000-segment building whose
 * fittings all carry project K values gets one note, not 5,000). Each names how many, lists the
 * elements (elementIds: the segments, or the nodes, in document order, each once) and, in its
 * detail, each distinct entry with its source, at most MAX_ENTRIES_NAMED of them.
 */
import { makeGroupedWarning, type EngineWarning } from '../warnings';
import type { ProjectDataUse } from './input';

/** Distinct entries named in a note's detail; the rest are counted (a choice: a readable line). */
export const MAX_ENTRIES_NAMED = 10;

export function projectDataNotes(uses: readonly ProjectDataUse[]): EngineWarning[] {
  const notes: EngineWarning[] = [];
  // Fixture groups (on nodes) come first in the document's reading order, then fittings (on segments).
  for (const elementType of ['node', 'fitting'] as const) {
    const ofType = uses.filter((u) => u.elementType === elementType);
    if (ofType.length > 0) notes.push(noteFor(elementType, ofType));
  }
  return notes;
}

function noteFor(elementType: 'node' | 'fitting', uses: ProjectDataUse[]): EngineWarning {
  const ids: string[] = [];
  const seenIds = new Set<string>();
  const entries = new Map<string, { text: string; count: number }>();
  for (const u of uses) {
    if (!seenIds.has(u.elementId)) {
      seenIds.add(u.elementId);
      ids.push(u.elementId);
    }
    const text = `${u.label}: source ${u.source}`;
    const e = entries.get(text);
    if (e) e.count++;
    else entries.set(text, { text, count: 1 });
  }
  let detail: string;
  if (uses.length === 1) {
    detail = uses[0].label + ': source ' + uses[0].source;
  } else {
    const what =
      elementType === 'fitting'
        ? `${uses.length} fittings on ${count(ids.length, 'segment')}`
        : `${uses.length} fixture groups at ${count(ids.length, 'node')}`;
    const named = [...entries.values()].slice(0, MAX_ENTRIES_NAMED).map((e) => (e.count > 1 ? `${e.text} (${e.count.toLocaleString('en-US')} uses)` : e.text));
    const more = entries.size - named.length;
    detail = `${what} use the project's own data: ${named.join('; ')}${more > 0 ? `; and ${more.toLocaleString('en-US')} more ${more === 1 ? 'entry' : 'entries'}` : ''}`;
  }
  return makeGroupedWarning('project-data-used', elementType, ids, detail);
}

function count(n: number, noun: string): string {
  return `${n.toLocaleString('en-US')} ${n === 1 ? noun : `${noun}s`}`;
}
