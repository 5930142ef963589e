import { createContext, useContext } from 'react';
import type { SystemDocument, UnitSystem } from '../../../engine';
import { UNIT_LABELS } from '../../../engine';
import type { Project } from '../../../shared/api/projects';
import type { Revision, SystemInfo } from '../../../shared/api/systems';
import type { Catalog } from '../../systems/api/get-catalog';
import type { Draft } from './use-draft';
import type { LiveAnalysis } from './live-analysis';

export interface WalkIds {
  projectId: string;
  systemId: string;
  revisionId: string;
}

/** Where the frame's links go: a revision's steps, or a field change's. */
export interface WalkLinks {
  step: (step: string) => string;
  /** the segment table, when this frame offers it */
  table: string | null;
  /** the building page (floors, typical units, the riser builder), when this frame offers it */
  building: string | null;
  diagram: string;
  /** the page above the steps (the system's overview, or the field change's side by side) */
  up: { href: string; label: string };
}

export interface WalkContextValue {
  ids: WalkIds;
  project: Project;
  system: SystemInfo;
  revision: Revision;
  /** why the steps are read-only, or null when the person may edit this draft */
  readOnlyReason: string | null;
  /**
   * What is being walked: the designer's revision, or a contractor's field change on an issued
   * revision, in which no segment, node or fixture may be added or removed (the server refuses it).
   */
  scope: 'design' | 'field-change';
  links: WalkLinks;
  draft: Draft;
  document: SystemDocument;
  live: LiveAnalysis;
  catalog: Catalog;
  units: (typeof UNIT_LABELS)[UnitSystem];
}

export const WalkContext = createContext<WalkContextValue | null>(null);

export function useWalk(): WalkContextValue {
  const value = useContext(WalkContext);
  if (!value) throw new Error('useWalk used outside the walk');
  return value;
}
