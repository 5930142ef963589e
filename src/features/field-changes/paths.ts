/**
 * The field-change pages, in the style of src/app/paths.ts: the router reads `path`, links call
 * `getHref`. The side-by-side page's address is the one the e-mails link to
 * (src/shared/api/fieldChanges.ts fieldChangeViewPath).
 */
import { fieldChangeViewPath } from '../../shared/api/fieldChanges';
import type { FieldChangeStepId } from './steps';

const e = encodeURIComponent;
const view = (projectId: string, systemId: string, fieldChangeId: string) => fieldChangeViewPath(e(projectId), e(systemId), e(fieldChangeId));

export const fieldChangePaths = {
  /** the frame of one field change; its index is the side by side with the proposal's state */
  view: {
    path: '/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId',
    getHref: view,
  },
  diagram: {
    path: '/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/diagram',
    getHref: (projectId: string, systemId: string, fieldChangeId: string) => `${view(projectId, systemId, fieldChangeId)}/diagram`,
  },
  step: {
    path: '/projects/:projectId/systems/:systemId/field-changes/:fieldChangeId/:step',
    getHref: (projectId: string, systemId: string, fieldChangeId: string, step: FieldChangeStepId) =>
      step === 'effect' ? view(projectId, systemId, fieldChangeId) : `${view(projectId, systemId, fieldChangeId)}/${e(step)}`,
  },
} as const;

export type FieldChangePathName = keyof typeof fieldChangePaths;
