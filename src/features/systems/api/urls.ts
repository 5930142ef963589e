/** The API addresses of the systems feature, in one place (ids are encoded). */
const e = encodeURIComponent;
export const systemUrls = {
  list: (projectId: string) => `/api/projects/${e(projectId)}/systems`,
  detail: (projectId: string, systemId: string) => `/api/projects/${e(projectId)}/systems/${e(systemId)}`,
  revisions: (projectId: string, systemId: string) => `${systemUrls.detail(projectId, systemId)}/revisions`,
  revision: (projectId: string, systemId: string, revisionId: string) => `${systemUrls.revisions(projectId, systemId)}/${e(revisionId)}`,
  document: (projectId: string, systemId: string, revisionId: string) => `${systemUrls.revision(projectId, systemId, revisionId)}/document`,
  issue: (projectId: string, systemId: string, revisionId: string) => `${systemUrls.revision(projectId, systemId, revisionId)}/issue`,
  compare: (projectId: string, systemId: string, a: string, b: string) => `${systemUrls.detail(projectId, systemId)}/compare?a=${e(a)}&b=${e(b)}`,
  /** the result for the engineer's report: one table as CSV, or every table as a spreadsheet workbook */
  exportCsv: (projectId: string, systemId: string, revisionId: string, table: 'segments' | 'fixtures' | 'ledgers') =>
    `${systemUrls.revision(projectId, systemId, revisionId)}/export/${table}.csv`,
  exportXlsx: (projectId: string, systemId: string, revisionId: string) => `${systemUrls.revision(projectId, systemId, revisionId)}/export.xlsx`,
  catalog: () => '/api/catalog',
};
