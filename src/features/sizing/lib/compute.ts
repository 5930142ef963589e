/**
 * One sizing run, as the worker and the in-page fallback both do it: the engine's sizeSystem on
 * the draft, its answer or its refusal as a plain message (structured-clone safe).
 */
import { isEngineInputError, sizeSystem, SizingError } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import type { SizingOptions, SizingResult } from '../../../engine';

export interface SizingRequest {
  document: SystemDocument;
  options: SizingOptions;
}

export type SizingReply =
  | { ok: true; result: SizingResult; millis: number }
  | { ok: false; code: string; message: string; elementId: string | null; millis: number };

export function computeSizing({ document, options }: SizingRequest): SizingReply {
  const started = performance.now();
  try {
    const result = sizeSystem(document, options);
    return { ok: true, result, millis: performance.now() - started };
  } catch (error) {
    const millis = performance.now() - started;
    if (error instanceof SizingError) return { ok: false, code: error.code, message: error.message, elementId: error.elementId, millis };
    if (isEngineInputError(error)) return { ok: false, code: 'input', message: error.message, elementId: null, millis };
    return { ok: false, code: 'unexpected', message: error instanceof Error ? error.message : String(error), elementId: null, millis };
  }
}
