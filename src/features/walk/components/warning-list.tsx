import type { EngineWarning } from '../../../engine';
import { WARNING_SEVERITY_WORDS as SEVERITY_WORDS } from '../../../engine/model/labels';

/** What a warning is about, in the words the designer typed (the engine's label), never an internal id. */
function aboutText(w: EngineWarning): string {
  const many = w.elementIds && w.elementIds.length > 1 ? w.elementIds.length : 0;
  if (many > 0) return `${many} ${w.elementType.replace(/-/g, ' ')}s`;
  if (w.elementLabel) return w.elementLabel;
  return w.elementType.replace(/-/g, ' ');
}
const SEVERITY_MARKS = { fail: '▲', caution: '◆', note: '●' } as const;

/** Engine warnings in plain words: the message, what it is about, and the numbers involved. */
export function WarningList({ title, warnings, empty }: { title: string; warnings: readonly EngineWarning[]; empty: string }) {
  return (
    <section aria-label={title} className="flex flex-col gap-2">
      <h3 className="text-lg">{title}</h3>
      {warnings.length === 0 ? (
        <p className="text-sm text-ink-soft">{empty}</p>
      ) : (
        <ul className="flex flex-col gap-2" data-testid="warning-list">
          {warnings.map((w, i) => (
            <li key={`${w.code}-${w.elementId ?? ''}-${i}`} className="rounded-md border-2 border-rule bg-surface p-2 text-sm" data-code={w.code}>
              <p className="font-semibold">
                <span aria-hidden="true">{SEVERITY_MARKS[w.severity]} </span>
                {SEVERITY_WORDS[w.severity]}: {w.message}
              </p>
              <p className="text-ink-soft">
                {aboutText(w)}
                {w.detail ? ` — ${w.detail}` : ''}
              </p>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
