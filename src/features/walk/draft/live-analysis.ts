import { safeAnalyzeSystem } from '../../../engine';
import type { Analysis, SystemDocument } from '../../../engine';

export type LiveAnalysis = { ok: true; analysis: Analysis; millis: number } | { ok: false; message: string; element: string | null; millis: number };

/**
 * The engine's analysis of the draft, run in the browser. An input the engine refuses is an
 * answer too (a structured error that names the element), never an exception on the page.
 */
export function analyseDraft(document: SystemDocument): LiveAnalysis {
  const started = performance.now();
  try {
    const result = safeAnalyzeSystem(document);
    const millis = performance.now() - started;
    if (result.ok) return { ok: true, analysis: result.analysis, millis };
    const { elementType, elementId, field } = result.error;
    const element = [elementType, elementId ? `“${elementId}”` : null, field ? `field ${field}` : null].filter(Boolean).join(' ');
    return { ok: false, message: result.error.message, element: element || null, millis };
  } catch (error) {
    return { ok: false, message: error instanceof Error ? error.message : String(error), element: null, millis: performance.now() - started };
  }
}
