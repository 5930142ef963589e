import { useCallback, useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { SystemDocumentSchema } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { errorMessage, isStaleVersion } from '../../../lib/error-messages';
import type { Revision } from '../../../shared/api/systems';
import { revisionQueryOptions } from '../../systems/api/get-revision';
import { useSaveDocument } from '../../systems/api/save-document';

export type SaveState = 'saved' | 'unsaved' | 'saving' | 'conflict' | 'failed';

/** Wait after the last change before an automatic save, ms (long enough to finish typing a number). */
export const AUTOSAVE_DELAY_MS = 1500;

export function parseRevisionDocument(revision: Revision): SystemDocument | null {
  const parsed = SystemDocumentSchema.safeParse(revision.document);
  return parsed.success ? parsed.data : null;
}

/**
 * The draft being walked: a copy of the revision's document taken when the walk opened, the
 * version it was taken at, and its save state. Saves send that version, so a save over someone
 * else's answers 409 and is never a silent overwrite.
 */
export function useDraft(ids: { projectId: string; systemId: string; revisionId: string }, revision: Revision, editable: boolean) {
  const queryClient = useQueryClient();
  const { mutateAsync: sendSave } = useSaveDocument();
  const [document, setDocument] = useState<SystemDocument | null>(() => parseRevisionDocument(revision));
  const [version, setVersion] = useState(revision.version);
  const [generation, setGeneration] = useState(0);
  const [state, setState] = useState<SaveState>('saved');
  const [failure, setFailure] = useState<string | null>(null);
  const latest = useRef(document);
  latest.current = document;
  const versionRef = useRef(version);
  versionRef.current = version;
  const stateRef = useRef<SaveState>('saved');

  const update = useCallback((change: (doc: SystemDocument) => SystemDocument) => {
    setDocument((doc) => (doc ? change(doc) : doc));
    setState((s) => (s === 'conflict' ? s : 'unsaved'));
  }, []);

  const saveNow = useCallback(
    async (atVersion?: number): Promise<number | null> => {
      const doc = latest.current;
      if (!doc || !editable) return null;
      setState('saving');
      setFailure(null);
      try {
        const saved = await sendSave({ ...ids, document: doc, version: atVersion ?? versionRef.current });
        setVersion(saved.version);
        // A change made while the request was out still needs saving.
        setState(latest.current === doc ? 'saved' : 'unsaved');
        return saved.version;
      } catch (error) {
        if (isStaleVersion(error)) setState('conflict');
        else {
          setState('failed');
          setFailure(errorMessage(error));
        }
        return null;
      }
    },
    [editable, ids, sendSave],
  );

  stateRef.current = state;
  useEffect(() => {
    if (state !== 'unsaved' || !editable) return;
    const timer = setTimeout(() => void saveNow(), AUTOSAVE_DELAY_MS);
    return () => clearTimeout(timer);
  }, [document, state, editable, saveNow]);

  const fetchCurrent = useCallback(
    () => queryClient.fetchQuery({ ...revisionQueryOptions(ids.projectId, ids.systemId, ids.revisionId), staleTime: 0 }),
    [queryClient, ids],
  );

  /** Drop my changes and take the draft as it is on the server now. */
  const reloadTheirs = useCallback(async () => {
    const current = await fetchCurrent();
    setDocument(parseRevisionDocument(current));
    setVersion(current.version);
    setGeneration((g) => g + 1);
    setState('saved');
    setFailure(null);
    return current;
  }, [fetchCurrent]);

  /** Save my draft on top of the version saved meanwhile (a deliberate choice, never automatic). */
  const keepMine = useCallback(async () => {
    const current = await fetchCurrent();
    setVersion(current.version);
    await saveNow(current.version);
  }, [fetchCurrent, saveNow]);

  return { document, version, generation, state, failure, update, saveNow: () => saveNow(),
    /** the version to issue: the saved one, after saving any change still pending */
    versionToIssue: async () => (stateRef.current === 'saved' ? versionRef.current : saveNow()), reloadTheirs, keepMine };
}

export type Draft = ReturnType<typeof useDraft>;
