/** The audit log of a project (who, when, what), newest first, for its designers. */
import { iso } from '../db/rows';
import type { ServiceContext } from './context';
import type { AuditEntry } from '../../src/shared/api/summaries';

interface AuditRow {
  id: string | number;
  at: Date;
  actor_id: string | null;
  actor_name: string | null;
  action: string;
  subject_type: string;
  subject_id: string | null;
  details: Record<string, unknown>;
}

export const auditService = {
  async list(ctx: ServiceContext, projectId: string, q: { before?: number; limit: number }): Promise<{ entries: AuditEntry[]; nextBefore: number | null }> {
    // the read side of server/repositories/audit.ts (which only records)
    const query = ctx
      .db('audit_log as a')
      .leftJoin('users as u', 'u.id', 'a.actor_id')
      .where('a.project_id', projectId)
      .select('a.id', 'a.at', 'a.actor_id', 'u.name as actor_name', 'a.action', 'a.subject_type', 'a.subject_id', 'a.details')
      .orderBy('a.id', 'desc')
      .limit(q.limit + 1);
    if (q.before) query.where('a.id', '<', q.before);
    const rows = (await query) as AuditRow[];
    const page = rows.slice(0, q.limit);
    return {
      entries: page.map((r) => ({
        id: Number(r.id),
        at: iso(r.at),
        actor: r.actor_id ? { id: r.actor_id, name: r.actor_name ?? '' } : null,
        action: r.action,
        subjectType: r.subject_type,
        subjectId: r.subject_id,
        details: r.details ?? {},
      })),
      nextBefore: rows.length > q.limit ? Number(page[page.length - 1].id) : null,
    };
  },
};
