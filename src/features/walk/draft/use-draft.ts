import { useCallback, useEffect, useRef, useState } from 'react';
import { SystemDocumentSchema } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { errorMessage, isStaleVersion } from '../../../lib/error-messages';

export type SaveState = 'saved' | 'unsaved' | 'saving' | 'conflict' | 'failed';

/** Wait after the last change before an automatic save, ms (long enough to finish typing a number). */
export const AUTOSAVE_DELAY_MS = 1500;

/** What a draft is kept in on the server: a draft revision, or a contractor's field change. */
export interface DraftStore {
  /** saves the document over the given version; resolves to the new version (409 STALE_VERSION when someone saved meanwhile) */
  save(document: SystemDocument, version: number): Promise<number>;
  /** the document and version as stored now */
  fetchCurrent(): Promise<StoredDocument>;
}

export interface StoredDocument {
  document: unknown;
  version: number;
}

export function parseStoredDocument(stored: Pick<StoredDocument, 'document'>): SystemDocument | null {
  const parsed = SystemDocumentSchema.safeParse(stored.document);
  return parsed.success ? parsed.data : null;
}

/**
 * The draft being walked: a copy of the stored document taken when the walk opened, the version
 * it was taken at, and its save state. Saves send that version, so a save over someone else's
 * answers 409 and is never a silent overwrite.
 */
export function useDraft(store: DraftStore, initial: StoredDocument, editable: boolean) {
  const [document, setDocument] = useState<SystemDocument | null>(() => parseStoredDocument(initial));
  const [version, setVersion] = useState(initial.version);
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
        const savedVersion = await store.save(doc, atVersion ?? versionRef.current);
        setVersion(savedVersion);
        versionRef.current = savedVersion;
        // A change made while the request was out still needs saving.
        setState(latest.current === doc ? 'saved' : 'unsaved');
        return savedVersion;
      } catch (error) {
        if (isStaleVersion(error)) setState('conflict');
        else {
          setState('failed');
          setFailure(errorMessage(error));
        }
        return null;
      }
    },
    [editable, store],
  );

  stateRef.current = state;
  useEffect(() => {
    if (state !== 'unsaved' || !editable) return;
    const timer = setTimeout(() => void saveNow(), AUTOSAVE_DELAY_MS);
    return () => clearTimeout(timer);
  }, [document, state, editable, saveNow]);

  /** Drop my changes and take the draft as it is on the server now. */
  const reloadTheirs = useCallback(async () => {
    const current = await store.fetchCurrent();
    setDocument(parseStoredDocument(current));
    setVersion(current.version);
    setGeneration((g) => g + 1);
    setState('saved');
    setFailure(null);
    return current;
  }, [store]);

  /** Save my draft on top of the version saved meanwhile (a deliberate choice, never automatic). */
  const keepMine = useCallback(async () => {
    const current = await store.fetchCurrent();
    setVersion(current.version);
    await saveNow(current.version);
  }, [store, saveNow]);

  /** The stored record moved on without its document changing (a title edit): carry on from its version. */
  const acknowledge = useCallback((stored: number) => {
    setVersion(stored);
    versionRef.current = stored;
  }, []);

  return { document, version, generation, state, failure, update, acknowledge, saveNow: () => saveNow(),
    /** the version to act on (issue, propose): the saved one, after saving any change still pending */
    versionToIssue: async () => (stateRef.current === 'saved' ? versionRef.current : saveNow()), reloadTheirs, keepMine };
}

export type Draft = ReturnType<typeof useDraft>;
