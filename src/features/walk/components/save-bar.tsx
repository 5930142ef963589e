import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/error-messages';
import type { Draft, SaveState } from '../draft/use-draft';

const STATE_WORDS: Record<SaveState, string> = {
  saved: 'All changes saved',
  unsaved: 'Not saved yet',
  saving: 'Saving…',
  conflict: 'Not saved: changed by someone else',
  failed: 'Not saved',
};

/** The name a field is shown with: its aria-label, or the text of its label; else its path. */
function fieldName(path: string): string {
  if (typeof document === 'undefined') return path;
  const el = document.querySelector(`[name="${path.replace(/"/g, '')}"]`);
  if (!el) return path;
  const aria = el.getAttribute('aria-label');
  if (aria) return aria;
  const label = el.id ? document.querySelector(`label[for="${el.id}"]`) : el.closest('label');
  return label?.textContent?.trim() || path;
}

/**
 * The draft's save state and an explicit Save. When someone else saved the draft meanwhile,
 * the person chooses: take theirs, or save theirs over with mine. Nothing is overwritten silently.
 */
export function SaveBar({ draft, editable }: { draft: Draft; editable: boolean }) {
  const [busy, setBusy] = useState<'reload' | 'keep' | null>(null);
  const [choiceError, setChoiceError] = useState<string | null>(null);
  const choose = async (which: 'reload' | 'keep') => {
    setBusy(which);
    setChoiceError(null);
    try {
      await (which === 'reload' ? draft.reloadTheirs() : draft.keepMine());
    } catch (error) {
      setChoiceError(errorMessage(error));
    } finally {
      setBusy(null);
    }
  };

  if (!editable) return null;
  const held = draft.held;
  // "All changes saved" is said only when no field holds a value that did not reach the draft
  const words =
    held.length > 0
      ? `${held.length === 1 ? '1 value' : `${held.length} values`} not saved: ${held
          .slice(0, 2)
          .map((h) => `${fieldName(h.path)} — ${h.message}`)
          .join('; ')}${held.length > 2 ? '; …' : ''}${draft.state === 'saved' ? '' : ` · ${STATE_WORDS[draft.state]}`}`
      : STATE_WORDS[draft.state];
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <p
          role="status"
          className={held.length ? 'text-sm font-semibold text-fault' : 'text-sm font-semibold'}
          data-testid="save-state"
          data-state={draft.state}
          data-held={held.length}
        >
          <span aria-hidden="true">{held.length ? '▲ ' : draft.state === 'saved' ? '● ' : draft.state === 'saving' ? '◌ ' : '○ '}</span>
          {words}
        </p>
        <Button
          variant="secondary"
          onClick={() => void draft.saveNow()}
          disabled={draft.state === 'saved' || draft.state === 'conflict'}
          pending={draft.state === 'saving'}
          pendingLabel="Saving…"
        >
          Save now
        </Button>
      </div>
      <div aria-live="assertive">
        {draft.state === 'conflict' ? (
          <Alert
            tone="caution"
            title="Someone else saved this draft since you opened it"
            actions={
              <>
                <Button onClick={() => void choose('reload')} pending={busy === 'reload'} pendingLabel="Reloading…" disabled={busy !== null}>
                  Reload theirs
                </Button>
                <Button variant="secondary" onClick={() => void choose('keep')} pending={busy === 'keep'} pendingLabel="Saving…" disabled={busy !== null}>
                  Keep mine
                </Button>
              </>
            }
          >
            Your changes are not saved, and theirs are not overwritten. “Reload theirs” drops your changes and shows the draft as it is saved now; “Keep mine”
            saves your draft on top of theirs.
            {choiceError ? <p className="mt-2 font-semibold">{choiceError}</p> : null}
          </Alert>
        ) : null}
        {draft.state === 'failed' ? (
          <Alert tone="fault" title="The draft was not saved">
            {draft.failure}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}
