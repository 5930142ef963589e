import { useRef, useState } from 'react';
import { Alert, LiveMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import type { FieldChange } from '../../../shared/api/fieldChanges';
import { ATTACHMENT_ACCEPT, useDeleteAttachment, useUploadAttachment } from '../api/attachments';
import type { FieldChangeIds } from '../api/urls';

const TYPE_WORDS = { 'application/pdf': 'PDF', 'image/jpeg': 'JPEG photo', 'image/png': 'PNG image' } as const;

function size(bytes: number) {
  return bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

/**
 * The product data sheets and photos of a field change. The author attaches them while it is a
 * draft or proposed and removes them while a draft; every project member can download them.
 */
export function AttachmentsPanel({ ids, fieldChange, isAuthor }: { ids: FieldChangeIds; fieldChange: FieldChange; isAuthor: boolean }) {
  const upload = useUploadAttachment();
  const remove = useDeleteAttachment();
  const input = useRef<HTMLInputElement>(null);
  const [done, setDone] = useState<string | null>(null);
  const canAttach = isAuthor && (fieldChange.status === 'draft' || fieldChange.status === 'proposed');
  const canRemove = isAuthor && fieldChange.status === 'draft';

  const send = (file: File) => {
    setDone(null);
    upload.mutate({ ids, file }, { onSuccess: (a) => setDone(`${a.fileName} attached.`) });
  };

  return (
    <Section title="Product data and photos" headingLevel={3}>
      {fieldChange.attachments.length === 0 ? (
        <p className="mb-3 text-ink-soft">No files yet. Attach the manufacturer’s data sheet of what goes in, and photos where they help.</p>
      ) : (
        <ul className="mb-3 flex flex-col gap-2" aria-label="Attached files" data-testid="attachments">
          {fieldChange.attachments.map((a) => (
            <li key={a.id} className="flex flex-wrap items-center gap-3 border-b border-rule pb-2">
              <a href={a.url} download={a.fileName} className="font-semibold">
                {a.fileName}
              </a>
              <span className="text-sm text-ink-soft">
                {TYPE_WORDS[a.contentType]} · {size(a.byteLength)} · {a.uploadedBy.name}, {formatDateTime(a.createdAt)}
              </span>
              {canRemove ? (
                <Button
                  variant="quiet"
                  onClick={() => remove.mutate({ ids, attachmentId: a.id })}
                  aria-label={`Remove ${a.fileName}`}
                  disabled={remove.isPending}
                >
                  Remove
                </Button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      {canAttach ? (
        <div className="flex flex-col gap-2">
          <label className="text-sm font-semibold">
            Attach a file (PDF, JPEG or PNG, up to 10 MB)
            <input
              ref={input}
              type="file"
              accept={ATTACHMENT_ACCEPT}
              className="mt-1 block text-sm"
              disabled={upload.isPending}
              onChange={(ev) => {
                const file = ev.target.files?.[0];
                if (file) send(file);
                ev.target.value = '';
              }}
            />
          </label>
          {upload.isPending ? <p className="text-sm">Uploading…</p> : null}
        </div>
      ) : null}
      <div aria-live="assertive" className="mt-2">
        {upload.isError ? (
          <Alert tone="fault" title="Not attached">
            {errorMessage(upload.error)}
          </Alert>
        ) : null}
        {remove.isError ? (
          <Alert tone="fault" title="Not removed">
            {errorMessage(remove.error)}
          </Alert>
        ) : null}
      </div>
      <LiveMessage message={done} />
    </Section>
  );
}
