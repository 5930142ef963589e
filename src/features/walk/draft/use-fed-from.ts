import { useEffect } from 'react';
import { applyFedFrom } from '../../../engine';
import { useColdSupply } from '../../systems/api/get-cold-supply';
import type { useDraft } from './use-draft';

/**
 * A hot draft fed from a cold system: its supply follows the cold system's current analysis, by the
 * engine's one resolver (hotWater/fedFrom.ts), the same the server applies at every save. A draft
 * only: an issued revision keeps what it was issued on.
 */
export function useFedFromSync(projectId: string, draft: ReturnType<typeof useDraft>, editable: boolean) {
  const fedFrom = draft.document?.source.fedFrom;
  const cold = useColdSupply(projectId, editable ? fedFrom?.systemId : undefined);
  const { document, update } = draft;
  const view = cold.data;
  useEffect(() => {
    if (!editable || !document || !document.source.fedFrom || view === undefined) return;
    if (applyFedFrom(document, view) !== document) update((doc) => applyFedFrom(doc, view));
  }, [editable, document, view, update]);
  return cold;
}
