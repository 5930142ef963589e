import { useEffect, useRef } from 'react';
import { useBlocker } from 'react-router-dom';
import type { Draft } from './use-draft';

/**
 * In-app navigation away from the walk (a breadcrumb, the main menu, any link) with an edit not
 * saved yet: the navigation waits while the edit is saved, then goes on. When the save fails
 * (someone else saved meanwhile, or the server refused it) the person stays, and the save bar
 * says why. Moving between the walk's own pages keeps the draft open and needs no wait.
 */
export function useSaveBeforeLeaving(draft: Draft, editable: boolean, insideWalk: (pathname: string) => boolean) {
  const pending = editable && (draft.state !== 'saved');
  const insideRef = useRef(insideWalk);
  insideRef.current = insideWalk;
  const blocker = useBlocker(({ currentLocation, nextLocation }) => pending && currentLocation.pathname !== nextLocation.pathname && !insideRef.current(nextLocation.pathname));
  const flush = draft.flush;
  useEffect(() => {
    if (blocker.state !== 'blocked') return;
    let cancelled = false;
    void flush().then((ok) => {
      if (cancelled) return;
      if (ok) blocker.proceed();
      else blocker.reset();
    });
    return () => {
      cancelled = true;
    };
  }, [blocker, flush]);
  return blocker.state === 'blocked';
}
