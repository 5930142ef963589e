import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { SystemDocumentSchema } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { errorMessage, isStaleVersion } from '../../../lib/error-messages';

/** A value a step's form holds that is not in the document (and so not saved): its field path and message. */
export interface HeldValue {
  path: string;
  message: string;
}

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
  /** the document as last saved (or as loaded) */
  const savedDoc = useRef(document);
  const versionRef = useRef(version);
  versionRef.current = version;
  const stateRef = useRef<SaveState>('saved');
  /** values the step forms hold that did not reach the document (refused numbers, out-of-range values), by form */
  const [heldByForm, setHeldByForm] = useState<Record<string, HeldValue[]>>({});
  const reportHeld = useCallback((formKey: string, values: HeldValue[]) => {
    setHeldByForm((prev) => {
      const before = prev[formKey] ?? [];
      if (before.length === values.length && before.every((v, i) => v.path === values[i].path && v.message === values[i].message)) return prev;
      const next = { ...prev };
      if (values.length) next[formKey] = values;
      else delete next[formKey];
      return next;
    });
  }, []);
  const held = useMemo(() => Object.values(heldByForm).flat(), [heldByForm]);

  const update = useCallback((change: (doc: SystemDocument) => SystemDocument) => {
    setDocument((doc) => (doc ? change(doc) : doc));
    setState((s) => (s === 'conflict' ? s : 'unsaved'));
  }, []);

  /** the save on its way, if any: a second save waits for it, so it is sent at the version the first one returns */
  const inFlight = useRef<Promise<number | null> | null>(null);
  const saveNow = useCallback(
    async (atVersion?: number): Promise<number | null> => {
      while (inFlight.current) await inFlight.current;
      const doc = latest.current;
      if (!doc || !editable) return null;
      const run = send(doc, atVersion);
      inFlight.current = run;
      try {
        return await run;
      } finally {
        if (inFlight.current === run) inFlight.current = null;
      }
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [editable, store],
  );

  const send = async (doc: SystemDocument, atVersion?: number): Promise<number | null> => {
    setState('saving');
    stateRef.current = 'saving';
    setFailure(null);
    try {
      const savedVersion = await store.save(doc, atVersion ?? versionRef.current);
      setVersion(savedVersion);
      versionRef.current = savedVersion;
      // A change made while the request was out still needs saving.
      savedDoc.current = doc;
      const next = latest.current === doc ? 'saved' : 'unsaved';
      setState(next);
      stateRef.current = next;
      return savedVersion;
    } catch (error) {
      if (isStaleVersion(error)) setState('conflict');
      else {
        setState('failed');
        setFailure(errorMessage(error));
      }
      stateRef.current = isStaleVersion(error) ? 'conflict' : 'failed';
      return null;
    }
  };

  /**
   * Before leaving the walk: save what is not saved yet, after any save on its way. Resolves true
   * when nothing is left unsaved (the caller may go on), false when the save failed (stay, and
   * let the save bar say why).
   */
  const flush = useCallback(async (): Promise<boolean> => {
    while (inFlight.current) await inFlight.current;
    if (!editable || latest.current === savedDoc.current || stateRef.current === 'saved') return true;
    if (stateRef.current === 'conflict') return false;
    return (await saveNow()) !== null;
  }, [editable, saveNow]);

  stateRef.current = state;
  useEffect(() => {
    if (state !== 'unsaved' || !editable) return;
    const timer = setTimeout(() => void saveNow(), AUTOSAVE_DELAY_MS);
    return () => clearTimeout(timer);
  }, [document, state, editable, saveNow]);

  /** Drop my changes and take the draft as it is on the server now. */
  const reloadTheirs = useCallback(async () => {
    const current = await store.fetchCurrent();
    const parsed = parseStoredDocument(current);
    savedDoc.current = parsed;
    latest.current = parsed;
    setDocument(parsed);
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

  return {
    document,
    version,
    generation,
    state,
    failure,
    update,
    acknowledge,
    saveNow: () => saveNow(),
    flush,
    held,
    reportHeld,
    /** the version to act on (issue, propose): the saved one, after saving any change still pending */
    versionToIssue: async () => (stateRef.current === 'saved' ? versionRef.current : saveNow()),
    reloadTheirs,
    keepMine,
  };
}

export type Draft = ReturnType<typeof useDraft>;
