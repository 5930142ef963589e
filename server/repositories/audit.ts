import type { Tx } from '../db/rows';

export interface AuditEntry {
  actorId: string | null;
  projectId?: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  details?: Record<string, unknown>;
}

export const auditRepo = {
  record: (db: Tx, e: AuditEntry) =>
    db('audit_log').insert({
      actor_id: e.actorId,
      project_id: e.projectId ?? null,
      action: e.action,
      subject_type: e.subjectType,
      subject_id: e.subjectId ?? null,
      details: JSON.stringify(e.details ?? {}),
    }),
};
