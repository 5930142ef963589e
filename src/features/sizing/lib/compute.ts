/**
 * One sizing run, as the worker and the in-page fallback both do it: the engine's sizeSystem on
 * the draft, its answer or its refusal as a plain message (structured-clone safe).
 */
import { isEngineInputError, sizeSystem, SizingError, smallestSubstitute } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import type { SizingOptions, SizingResult } from '../../../engine';

export interface SizingRequest {
  document: SystemDocument;
  options: SizingOptions;
  /** A contractor's substitution: these segments take this material at their smallest passing sizes (substitute.ts). */
  substitute?: { segmentIds: string[]; material: string };
}

export interface SubstituteAnswer {
  material: string;
  substituted: string[];
  skipped: { segmentId: string; reason: 'locked' | 'custom-pipe' }[];
}

export type SizingReply =
  | { ok: true; result: SizingResult; substitute: SubstituteAnswer | null; millis: number }
  | { ok: false; code: string; message: string; elementId: string | null; millis: number };

export function computeSizing({ document, options, substitute }: SizingRequest): SizingReply {
  const started = performance.now();
  try {
    if (substitute) {
      const r = smallestSubstitute(document, { ...substitute, marginPa: options.marginPa });
      return {
        ok: true,
        result: r.sizing,
        substitute: { material: r.material, substituted: r.substituted, skipped: r.skipped },
        millis: performance.now() - started,
      };
    }
    const result = sizeSystem(document, options);
    return { ok: true, result, substitute: null, millis: performance.now() - started };
  } catch (error) {
    const millis = performance.now() - started;
    if (error instanceof SizingError) return { ok: false, code: error.code, message: error.message, elementId: error.elementId, millis };
    if (isEngineInputError(error)) return { ok: false, code: 'input', message: error.message, elementId: null, millis };
    return { ok: false, code: 'unexpected', message: error instanceof Error ? error.message : String(error), elementId: null, millis };
  }
}
