/**
 * Attachments of a field change: product data sheets (PDF) and photos (JPEG, PNG). The type is
 * the one the content's first bytes say (server/services/fileTypes.ts); the name is sanitised; the bytes
 * are kept in PostgreSQL with their SHA-256, size, type and uploader.
 */
import { createHash } from 'node:crypto';
import { conflict, forbidden, invalid, notFound } from './errors';
import { detectType, sanitizeFileName } from './fileTypes';
import { attachmentsRepo, type AttachmentRow } from '../repositories/attachments';
import { fieldChangesRepo } from '../repositories/fieldChanges';
import { locks } from '../repositories/locks';
import { auditRepo } from '../repositories/audit';
import { iso } from '../db/rows';
import type { Actor, ServiceContext } from './context';
import { fieldChangesApiPath, type Attachment } from '../../src/shared/api/fieldChanges';

/** Attachments per field change: a choice (a few data sheets and photos; a bound on what one contractor stores). */
export const MAX_ATTACHMENTS = 20;

export const toAttachment = (r: AttachmentRow, systemId: string): Attachment => ({
  id: r.id,
  fileName: r.file_name,
  contentType: r.content_type,
  byteLength: r.byte_length,
  sha256: r.sha256,
  uploadedBy: { id: r.uploaded_by, name: r.uploader_name, email: r.uploader_email },
  createdAt: iso(r.created_at),
  url: `${fieldChangesApiPath(r.project_id, systemId)}/${r.field_change_id}/attachments/${r.id}`,
});

export interface UploadedFile {
  buffer: Buffer;
  originalname: string;
}

export const attachmentsService = {
  async add(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, fieldChangeId: string, file: UploadedFile): Promise<Attachment> {
    const id = await ctx.db.transaction(async (trx) => {
      const row = await locks.fieldChange(trx, projectId, systemId, fieldChangeId);
      if (!row) throw notFound('The field change');
      if (row.created_by !== actor.id) throw forbidden('Only the contractor who started this field change attaches files to it.');
      if (row.status !== 'draft' && row.status !== 'proposed')
        throw conflict(`Field change ${row.number} is ${row.status}; files are attached while it is a draft or proposed.`);
      if (file.buffer.length === 0) throw invalid('The file is empty; nothing was stored.', { file: 'Empty file' });
      const type = detectType(file.buffer);
      if (!type) {
        throw invalid('The file is not a PDF, JPEG or PNG by its content (its name and declared type are not trusted); nothing was stored.', {
          file: 'Not a PDF, JPEG or PNG',
        });
      }
      if ((await attachmentsRepo.count(trx, fieldChangeId)) >= MAX_ATTACHMENTS)
        throw conflict(`A field change holds at most ${MAX_ATTACHMENTS} files; remove one first.`);
      const fileName = sanitizeFileName(file.originalname, type);
      const sha256 = createHash('sha256').update(file.buffer).digest('hex');
      const attachmentId = await attachmentsRepo.insert(trx, {
        field_change_id: fieldChangeId,
        project_id: projectId,
        file_name: fileName,
        content_type: type,
        byte_length: file.buffer.length,
        sha256,
        content: file.buffer,
        uploaded_by: actor.id,
      });
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'field-change.attachment-added',
        subjectType: 'field-change',
        subjectId: fieldChangeId,
        details: { attachmentId, fileName, contentType: type, bytes: file.buffer.length, sha256 },
      });
      return attachmentId;
    });
    return toAttachment((await attachmentsRepo.find(ctx.db, fieldChangeId, id))!, systemId);
  },

  async download(ctx: ServiceContext, projectId: string, systemId: string, fieldChangeId: string, attachmentId: string) {
    if (!(await fieldChangesRepo.find(ctx.db, projectId, systemId, fieldChangeId))) throw notFound('The field change');
    const info = await attachmentsRepo.find(ctx.db, fieldChangeId, attachmentId);
    if (!info || info.project_id !== projectId) throw notFound('The attachment');
    const bytes = await attachmentsRepo.content(ctx.db, attachmentId);
    if (!bytes) throw notFound('The attachment');
    return { bytes, fileName: info.file_name, contentType: info.content_type, sha256: info.sha256 };
  },

  async remove(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, fieldChangeId: string, attachmentId: string): Promise<void> {
    await ctx.db.transaction(async (trx) => {
      const row = await locks.fieldChange(trx, projectId, systemId, fieldChangeId);
      if (!row) throw notFound('The field change');
      if (row.created_by !== actor.id) throw forbidden('Only the contractor who started this field change removes its files.');
      if (row.status !== 'draft') throw conflict(`Field change ${row.number} is ${row.status}; its files stay as they were sent.`);
      const info = await attachmentsRepo.find(trx, fieldChangeId, attachmentId);
      if (!info) throw notFound('The attachment');
      await attachmentsRepo.remove(trx, fieldChangeId, attachmentId);
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'field-change.attachment-removed',
        subjectType: 'field-change',
        subjectId: fieldChangeId,
        details: { attachmentId, fileName: info.file_name, sha256: info.sha256 },
      });
    });
  },
};
