import { useEffect, useRef } from 'react';
import { useBlocker } from 'react-router-dom';
import type { Draft } from './use-draft';

export type Leaving =
  | { state: 'idle' }
  | { state: 'saving' }
  /** a field holds a value that cannot be saved (refused or out of range): the person chooses */
  | { state: 'held'; stay: () => void; leave: () => void };

/**
 * In-app navigation away from the walk (a breadcrumb, the main menu, any link) with an edit not
 * saved yet: the navigation waits while the edit is saved, then goes on. When the save fails
 * (someone else saved meanwhile, or the server refused it) the person stays, and the save bar
 * says why. When a field holds a value that cannot be saved, the person is asked. Moving between
 * the walk's own pages keeps the draft open and needs no wait.
 */
export function useSaveBeforeLeaving(draft: Draft, editable: boolean, insideWalk: (pathname: string) => boolean): Leaving {
  const pending = editable && (draft.state !== 'saved' || draft.held.length > 0);
  const insideRef = useRef(insideWalk);
  insideRef.current = insideWalk;
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) => pending && currentLocation.pathname !== nextLocation.pathname && !insideRef.current(nextLocation.pathname),
  );
  const flush = draft.flush;
  const heldCount = draft.held.length;
  useEffect(() => {
    if (blocker.state !== 'blocked' || heldCount > 0) return;
    let cancelled = false;
    void flush().then((ok) => {
      if (cancelled) return;
      if (ok) blocker.proceed();
      else blocker.reset();
    });
    return () => {
      cancelled = true;
    };
  }, [blocker, flush, heldCount]);
  if (blocker.state !== 'blocked') return { state: 'idle' };
  if (heldCount > 0) {
    return {
      state: 'held',
      stay: () => blocker.reset(),
      leave: () => void flush().then((ok) => (ok ? blocker.proceed() : blocker.reset())),
    };
  }
  return { state: 'saving' };
}
