import type { Tx } from '../db/rows';
import type { Attachment } from '../../src/shared/api/fieldChanges';

export interface AttachmentRow {
  id: string;
  field_change_id: string;
  project_id: string;
  file_name: string;
  content_type: Attachment['contentType'];
  byte_length: number;
  sha256: string;
  uploaded_by: string;
  uploader_name: string;
  uploader_email: string;
  created_at: Date;
}

/** every column but the bytes (lists never carry them) */
const INFO_COLUMNS = [
  'a.id',
  'a.field_change_id',
  'a.project_id',
  'a.file_name',
  'a.content_type',
  'a.byte_length',
  'a.sha256',
  'a.uploaded_by',
  'u.name as uploader_name',
  'u.email as uploader_email',
  'a.created_at',
];

export const attachmentsRepo = {
  listForFieldChange: (db: Tx, fieldChangeId: string) =>
    db('field_change_attachments as a')
      .join('users as u', 'u.id', 'a.uploaded_by')
      .where('a.field_change_id', fieldChangeId)
      .select(INFO_COLUMNS)
      .orderBy('a.created_at') as Promise<AttachmentRow[]>,
  find: (db: Tx, fieldChangeId: string, id: string) =>
    db('field_change_attachments as a')
      .join('users as u', 'u.id', 'a.uploaded_by')
      .where({ 'a.id': id, 'a.field_change_id': fieldChangeId })
      .first(INFO_COLUMNS) as Promise<AttachmentRow | undefined>,
  async content(db: Tx, id: string): Promise<Buffer | null> {
    const row = await db('field_change_attachments').where({ id }).first('content');
    return row?.content ?? null;
  },
  count: async (db: Tx, fieldChangeId: string) =>
    Number(((await db('field_change_attachments').where({ field_change_id: fieldChangeId }).count({ n: '*' }).first()) as { n: string }).n),
  async insert(
    db: Tx,
    values: {
      field_change_id: string;
      project_id: string;
      file_name: string;
      content_type: string;
      byte_length: number;
      sha256: string;
      content: Buffer;
      uploaded_by: string;
    },
  ) {
    const [row] = await db('field_change_attachments').insert(values).returning('id');
    return (row as { id: string }).id;
  },
  remove: (db: Tx, fieldChangeId: string, id: string) => db('field_change_attachments').where({ id, field_change_id: fieldChangeId }).delete(),
};
