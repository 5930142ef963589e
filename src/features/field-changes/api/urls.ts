import { fieldChangesApiPath } from '../../../shared/api/fieldChanges';

/** The API addresses of the field-changes feature, in one place (ids are encoded). */
const e = encodeURIComponent;
const one = (projectId: string, systemId: string, fieldChangeId: string) => `${fieldChangesApiPath(e(projectId), e(systemId))}/${e(fieldChangeId)}`;

export const fieldChangeUrls = {
  forProject: (projectId: string, status?: string) => `/api/projects/${e(projectId)}/field-changes${status ? `?status=${e(status)}` : ''}`,
  forSystem: (projectId: string, systemId: string) => fieldChangesApiPath(e(projectId), e(systemId)),
  one,
  comparison: (projectId: string, systemId: string, fieldChangeId: string) => `${one(projectId, systemId, fieldChangeId)}/comparison`,
  action: (projectId: string, systemId: string, fieldChangeId: string, action: 'propose' | 'accept' | 'decline') =>
    `${one(projectId, systemId, fieldChangeId)}/${action}`,
  attachments: (projectId: string, systemId: string, fieldChangeId: string) => `${one(projectId, systemId, fieldChangeId)}/attachments`,
  attachment: (projectId: string, systemId: string, fieldChangeId: string, attachmentId: string) =>
    `${one(projectId, systemId, fieldChangeId)}/attachments/${e(attachmentId)}`,
};

export type FieldChangeIds = { projectId: string; systemId: string; fieldChangeId: string };
