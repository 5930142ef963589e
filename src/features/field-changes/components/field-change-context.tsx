import { createContext, useContext } from 'react';
import type { FieldChange } from '../../../shared/api/fieldChanges';
import type { Revision } from '../../../shared/api/systems';
import type { SystemDocument } from '../../../engine';
import type { LiveAnalysis } from '../../walk/draft/live-analysis';
import type { FieldChangeIds } from '../api/urls';

export interface FieldChangeContextValue {
  ids: FieldChangeIds;
  fieldChange: FieldChange;
  /** the issued revision the field change started from */
  base: Revision;
  baseDocument: SystemDocument;
  /** the engine's run of the issued document, in the browser (the "before" of every live figure) */
  issuedLive: LiveAnalysis;
  /** why the field change cannot be edited by this person now, or null for its author while a draft */
  readOnlyReason: string | null;
  isAuthor: boolean;
  isDesigner: boolean;
}

export const FieldChangeContext = createContext<FieldChangeContextValue | null>(null);

export function useFieldChangeFrame(): FieldChangeContextValue {
  const value = useContext(FieldChangeContext);
  if (!value) throw new Error('useFieldChangeFrame used outside a field change');
  return value;
}
