import { groupWarnings, type EngineWarning } from '../../../engine';
import { WARNING_SEVERITY_WORDS as SEVERITY_WORDS } from '../../../engine/model/labels';

/** What a warning is about, in the words the designer typed (the engine's label), never an internal id. */
function aboutText(w: EngineWarning): string {
  const many = w.elementIds && w.elementIds.length > 1 ? w.elementIds.length : 0;
  if (many > 0) return `${many} ${w.elementType.replace(/-/g, ' ')}s`;
  if (w.elementLabel) return w.elementLabel;
  return w.elementType.replace(/-/g, ' ');
}
const SEVERITY_MARKS = { fail: '▲', caution: '◆', note: '●' } as const;
/** Names shown before the list of a repeated warning is opened. */
const NAMES_SHOWN = 3;

/**
 * Engine warnings in plain words: the message, what it is about, and the numbers involved. The
 * same warning on several elements is one item naming them (groupWarnings, as the PDF lists
 * them): its count and first names, the full list behind a disclosure.
 */
export function WarningList({ title, warnings, empty }: { title: string; warnings: readonly EngineWarning[]; empty: string }) {
  const groups = groupWarnings(warnings, aboutText);
  return (
    <section aria-label={title} className="flex flex-col gap-2">
      <h3 className="text-lg">{title}</h3>
      {groups.length === 0 ? (
        <p className="text-sm text-ink-soft">{empty}</p>
      ) : (
        <ul className="flex flex-col gap-2" data-testid="warning-list">
          {groups.map((g, i) => (
            <li
              key={`${g.code}-${g.warnings[0].elementId ?? ''}-${i}`}
              className="rounded-md border-2 border-rule bg-surface p-2 text-sm"
              data-code={g.code}
              data-count={g.warnings.length}
            >
              <p className="font-semibold">
                <span aria-hidden="true">{SEVERITY_MARKS[g.severity]} </span>
                {SEVERITY_WORDS[g.severity]}: {g.message}
              </p>
              {g.wheres.length === 1 ? (
                <p className="text-ink-soft">
                  {g.wheres[0]}
                  {g.detail ? ` — ${g.detail}` : ''}
                </p>
              ) : (
                <>
                  {g.detail ? <p className="text-ink-soft">{g.detail}</p> : null}
                  <details className="text-ink-soft">
                    <summary className="cursor-pointer">
                      {g.wheres.length} places: {g.wheres.slice(0, NAMES_SHOWN).join('; ')}
                      {g.wheres.length > NAMES_SHOWN ? `; and ${g.wheres.length - NAMES_SHOWN} more` : ''}
                    </summary>
                    <ul className="mt-1 list-disc pl-5" aria-label={`Where: ${g.wheres.length} places`}>
                      {g.wheres.map((where, k) => (
                        <li key={k}>{where}</li>
                      ))}
                    </ul>
                  </details>
                </>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
