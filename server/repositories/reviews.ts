import type { Tx } from '../db/rows';

export interface ReviewRow {
  id: string;
  project_id: string;
  revision_id: string;
  reviewer_id: string;
  sent_by: string | null;
  status: 'received' | 'accepted' | 'returned';
  comment: string;
  version: number;
  received_at: Date;
  decided_at: Date | null;
  // joined
  system_id: string;
  system_name: string;
  revision_number: number;
  revision_status: 'draft' | 'issued' | 'superseded';
  reviewer_name: string;
  reviewer_email: string;
  sent_by_name: string | null;
}

export interface ReviewCommentRow {
  review_id: string;
  item_type: 'segment' | 'fixture' | 'device' | 'node' | 'input' | 'general';
  item_id: string | null;
  comment: string;
}

const joined = (db: Tx) =>
  db('reviews as r')
    .join('revisions as v', 'v.id', 'r.revision_id')
    .join('systems as s', 's.id', 'v.system_id')
    .join('users as u', 'u.id', 'r.reviewer_id')
    .leftJoin('users as sb', 'sb.id', 'r.sent_by')
    .select('r.*', 's.id as system_id', 's.name as system_name', 'v.number as revision_number', 'v.status as revision_status', 'u.name as reviewer_name', 'u.email as reviewer_email', 'sb.name as sent_by_name')
    .orderBy([{ column: 'r.received_at', order: 'desc' }, { column: 'r.id' }]);

export const reviewsRepo = {
  /** The reviewer's review of the revision, made on the first send; a repeated send keeps it. Returns its id. */
  async receive(db: Tx, v: { project_id: string; revision_id: string; reviewer_id: string; sent_by: string }): Promise<string> {
    await db('reviews').insert(v).onConflict(['revision_id', 'reviewer_id']).ignore();
    const row = await db('reviews').where({ revision_id: v.revision_id, reviewer_id: v.reviewer_id }).first('id');
    return row.id;
  },
  byIds: (db: Tx, ids: string[]) => joined(db).whereIn('r.id', ids) as Promise<ReviewRow[]>,
  forRevision: (db: Tx, revisionId: string) => joined(db).where('r.revision_id', revisionId) as Promise<ReviewRow[]>,
  forProject: (db: Tx, projectId: string) => joined(db).where('r.project_id', projectId) as Promise<ReviewRow[]>,
  /** The reviewer's reviews in projects where they are still a member. */
  forReviewer: (db: Tx, userId: string) =>
    joined(db)
      .where('r.reviewer_id', userId)
      .whereExists((q) => q.select(db.raw('1')).from('project_members as m').whereRaw('m.project_id = r.project_id').andWhere('m.user_id', userId)) as Promise<ReviewRow[]>,
  lock: (db: Tx, projectId: string, id: string) => db<ReviewRow>('reviews').where({ id, project_id: projectId }).forUpdate().first(),
  async decide(db: Tx, id: string, version: number, v: { status: 'accepted' | 'returned'; comment: string }) {
    const n = await db('reviews').where({ id, version, status: 'received' }).update({ ...v, decided_at: db.fn.now(), version: db.raw('version + 1') });
    return n === 1;
  },
  addComments: (db: Tx, reviewId: string, items: { itemType: ReviewCommentRow['item_type']; itemId: string | null; comment: string }[]) =>
    items.length ? db('review_comments').insert(items.map((i) => ({ review_id: reviewId, item_type: i.itemType, item_id: i.itemId, comment: i.comment }))) : Promise.resolve(),
  commentsFor: (db: Tx, reviewIds: string[]) => db<ReviewCommentRow>('review_comments').whereIn('review_id', reviewIds).orderBy('id') as Promise<ReviewCommentRow[]>,
};
