/**
 * Warnings grouped the way a reader wants them: the same code, severity and words (message and
 * detail) on several elements make one group naming every element, in the order the engine
 * raised them. The PDF summary lists one row per group; the screens show one caution per group
 * with its names collapsed (a demo building raises one "another method was used" caution per
 * PEX fitting, which a reader takes in as one finding about many segments, not as 98 findings).
 */
import type { EngineWarning } from './warnings';

export interface WarningGroup<W extends EngineWarning = EngineWarning> {
  severity: EngineWarning['severity'];
  code: EngineWarning['code'];
  message: string;
  detail: string | undefined;
  /** The message with its detail, as one sentence: "message (detail)". */
  what: string;
  /** Where each warning of the group applies, in the caller's words, in the engine's order. */
  wheres: string[];
  warnings: W[];
}

/** Groups warnings of equal severity, code, message and detail; `where` names each warning's element. */
export function groupWarnings<W extends EngineWarning>(warnings: readonly W[], where: (w: W) => string): WarningGroup<W>[] {
  const groups = new Map<string, WarningGroup<W>>();
  for (const w of warnings) {
    const what = w.detail ? `${w.message} (${w.detail})` : w.message;
    const key = `${w.severity}\u0000${w.code}\u0000${what}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { severity: w.severity, code: w.code, message: w.message, detail: w.detail, what, wheres: [], warnings: [] }));
    g.wheres.push(where(w));
    g.warnings.push(w);
  }
  return [...groups.values()];
}
