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
  answered_in_revision_id: string | null;
  package_id: string | null;
  // joined
  answered_in_number: number | null;
  record_file_name: string | null;
  record_sha256: string | null;
  record_created_at: Date | null;
  system_id: string;
  system_name: string;
  revision_number: number;
  revision_status: 'draft' | 'issued' | 'superseded';
  reviewer_name: string;
  reviewer_email: string;
  sent_by_name: string | null;
}

export interface ReviewCommentRow {
  id: string;
  review_id: string;
  item_type: 'segment' | 'fixture' | 'device' | 'node' | 'input' | 'general';
  item_id: string | null;
  comment: string;
  reply: string | null;
  replied_at: Date | null;
  replied_by_name: string | null;
}

/** The newest decided review of a system's issued revision (the "returned to you" marker when it is returned). */
export interface NewestDecisionRow {
  system_id: string;
  review_id: string;
  status: 'accepted' | 'returned';
  revision_id: string;
  revision_number: number;
  reviewer_name: string;
  decided_at: Date;
  comments: number;
  answered: number;
}

const joined = (db: Tx) =>
  db('reviews as r')
    .join('revisions as v', 'v.id', 'r.revision_id')
    .join('systems as s', 's.id', 'v.system_id')
    .join('users as u', 'u.id', 'r.reviewer_id')
    .leftJoin('users as sb', 'sb.id', 'r.sent_by')
    .leftJoin('revisions as av', 'av.id', 'r.answered_in_revision_id')
    .leftJoin('acceptance_records as ar', 'ar.review_id', 'r.id')
    .select(
      'r.*',
      's.id as system_id',
      's.name as system_name',
      'v.number as revision_number',
      'v.status as revision_status',
      'u.name as reviewer_name',
      'u.email as reviewer_email',
      'sb.name as sent_by_name',
      'av.number as answered_in_number',
      'ar.file_name as record_file_name',
      'ar.sha256 as record_sha256',
      'ar.created_at as record_created_at',
    )
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
      .whereExists((q) => q.select(db.raw('1')).from('project_members as m').whereRaw('m.project_id = r.project_id').andWhere('m.user_id', userId)) as Promise<
      ReviewRow[]
    >,
  lock: (db: Tx, projectId: string, id: string) => db<ReviewRow>('reviews').where({ id, project_id: projectId }).forUpdate().first(),
  async decide(db: Tx, id: string, version: number, v: { status: 'accepted' | 'returned'; comment: string }) {
    const n = await db('reviews')
      .where({ id, version, status: 'received' })
      .update({ ...v, decided_at: db.fn.now(), version: db.raw('version + 1') });
    return n === 1;
  },
  addComments: (db: Tx, reviewId: string, items: { itemType: ReviewCommentRow['item_type']; itemId: string | null; comment: string }[]) =>
    items.length
      ? db('review_comments').insert(items.map((i) => ({ review_id: reviewId, item_type: i.itemType, item_id: i.itemId, comment: i.comment })))
      : Promise.resolve(),
  commentsFor: (db: Tx, reviewIds: string[]) =>
    db('review_comments as c')
      .leftJoin('users as ru', 'ru.id', 'c.replied_by')
      .whereIn('c.review_id', reviewIds)
      .orderBy('c.id')
      .select('c.id', 'c.review_id', 'c.item_type', 'c.item_id', 'c.comment', 'c.reply', 'c.replied_at', 'ru.name as replied_by_name')
      .then((rows: ReviewCommentRow[]) => rows.map((r) => ({ ...r, id: String(r.id) }))),
  /** The comment of that review, locked for the reply. */
  lockComment: (db: Tx, reviewId: string, commentId: string) => db('review_comments').where({ id: commentId, review_id: reviewId }).forUpdate().first('id'),
  setReply: (db: Tx, commentId: string, reply: string, userId: string) =>
    db('review_comments').where({ id: commentId }).update({ reply, replied_by: userId, replied_at: db.fn.now() }),
  /**
   * In the transaction that issues `newRevisionId`: the returned reviews of the system's issued
   * revision (the one about to be superseded) are answered by the new revision; their replies freeze.
   */
  markAnswered: (db: Tx, systemId: string, newRevisionId: string) =>
    db('reviews')
      .whereIn('revision_id', db('revisions').where({ system_id: systemId, status: 'issued' }).whereNot({ id: newRevisionId }).select('id'))
      .where({ status: 'returned' })
      .whereNull('answered_in_revision_id')
      .update({ answered_in_revision_id: newRevisionId }),
  /** The returned reviews a revision answers. */
  answeredBy: (db: Tx, revisionId: string) => joined(db).where('r.answered_in_revision_id', revisionId) as Promise<ReviewRow[]>,
  /** Per system (of those given), the newest decided review of its issued revision. */
  async newestDecisions(db: Tx, systemIds: string[]): Promise<NewestDecisionRow[]> {
    if (!systemIds.length) return [];
    const { rows } = await db.raw(
      `SELECT DISTINCT ON (v.system_id) v.system_id, r.id AS review_id, r.status, v.id AS revision_id, v.number AS revision_number, u.name AS reviewer_name, r.decided_at,
              (SELECT count(*)::int FROM review_comments c WHERE c.review_id = r.id) AS comments,
              (SELECT count(*)::int FROM review_comments c WHERE c.review_id = r.id AND c.reply IS NOT NULL) AS answered
         FROM reviews r
         JOIN revisions v ON v.id = r.revision_id
         JOIN users u ON u.id = r.reviewer_id
        WHERE v.system_id = ANY(?::uuid[]) AND v.status = 'issued' AND r.status IN ('accepted', 'returned') AND r.decided_at IS NOT NULL
        ORDER BY v.system_id, r.decided_at DESC, r.id`,
      [systemIds],
    );
    return rows as NewestDecisionRow[];
  },
};

export interface AcceptanceRecordRow {
  id: string;
  review_id: string;
  project_id: string;
  revision_id: string;
  file_name: string;
  sha256: string;
  byte_length: number;
  created_at: Date;
}

export const acceptanceRecordsRepo = {
  insert: (db: Tx, v: { review_id: string; project_id: string; revision_id: string; file_name: string; pdf: Buffer; sha256: string; byte_length: number }) =>
    db('acceptance_records').insert(v),
  /** The record's bytes, only when the review is of that project. */
  pdfOf: (db: Tx, projectId: string, reviewId: string) =>
    db('acceptance_records').where({ review_id: reviewId, project_id: projectId }).first('pdf', 'sha256', 'file_name') as Promise<
      { pdf: Buffer; sha256: string; file_name: string } | undefined
    >,
};
