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
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <p role="status" className="text-sm font-semibold" data-testid="save-state" data-state={draft.state}>
          <span aria-hidden="true">{draft.state === 'saved' ? '● ' : draft.state === 'saving' ? '◌ ' : '○ '}</span>
          {STATE_WORDS[draft.state]}
        </p>
        <Button variant="secondary" onClick={() => void draft.saveNow()} disabled={draft.state === 'saved' || draft.state === 'conflict'} pending={draft.state === 'saving'} pendingLabel="Saving…">
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
            Your changes are not saved, and theirs are not overwritten. “Reload theirs” drops your changes and shows the
            draft as it is saved now; “Keep mine” saves your draft on top of theirs.
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
