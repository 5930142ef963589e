import { useEffect, useRef, useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import type { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField, TextAreaField, TextField } from '../../../components/ui/field';
import { Loading } from '../../../components/ui/loading';
import { isApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-messages';
import type { SendSummaryResponse } from '../../../shared/api/summaries';
import { useMembers } from '../../members/api/get-members';
import { sendSummaryInputSchema, toSendSummaryBody, useSendSummary } from '../api/send-summary';
import type { SendSummaryInput } from '../api/send-summary';

type Values = z.output<typeof sendSummaryInputSchema>;
type Ids = { projectId: string; systemId: string; revisionId: string };

const EMPTY: SendSummaryInput = { inspectorIds: [], emails: [], message: '' };

/**
 * The send form: the project's inspectors to tick, outside addresses to add (each becomes an
 * inspector of the project and gets an invitation in the same e-mail), and a note.
 */
function SendSummaryForm({
  ids,
  revisionNumber,
  onSent,
  onCancel,
}: {
  ids: Ids;
  revisionNumber: number;
  onSent: (result: SendSummaryResponse) => void;
  onCancel: () => void;
}) {
  const members = useMembers(ids.projectId);
  const send = useSendSummary();
  const form = useForm<SendSummaryInput, unknown, Values>({ resolver: zodResolver(sendSummaryInputSchema), defaultValues: EMPTY });
  const emails = useFieldArray({ control: form.control, name: 'emails' });
  const { errors } = form.formState;
  const inspectors = (members.data ?? []).filter((m) => m.role === 'inspector');

  const onSubmit = form.handleSubmit((values) => {
    send.mutate(
      { ...ids, body: toSendSummaryBody(values) },
      {
        onSuccess: (result) => {
          form.reset(EMPTY);
          onSent(result);
        },
        onError: (error) => {
          if (!isApiError(error) || error.code !== 'VALIDATION_FAILED') return;
          // the server names outside addresses by their index in the body, which follows the rows
          for (const [path, message] of Object.entries(error.fields)) {
            const row = /^emails\.(\d+)$/.exec(path);
            if (row) form.setError(`emails.${Number(row[1])}.address`, { type: 'server', message });
          }
        },
      },
    );
  });

  const unnamedServerError =
    send.isError &&
    !(isApiError(send.error) && send.error.code === 'VALIDATION_FAILED' && Object.keys(send.error.fields).every((f) => f.startsWith('emails.')));

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label={`Send revision ${revisionNumber} to inspectors`}>
      <fieldset className="flex flex-col gap-2" aria-describedby={errors.inspectorIds ? 'send-recipients-error' : undefined}>
        <legend className="mb-1 text-sm font-semibold">Inspectors of this project</legend>
        {members.isPending ? <Loading label="Loading the project's inspectors…" /> : null}
        {members.isError ? (
          <Alert tone="fault" title="The members could not be loaded">
            {errorMessage(members.error)}
          </Alert>
        ) : null}
        {members.data && inspectors.length === 0 ? (
          <p className="text-sm text-ink-soft">No inspector is a member of this project yet. Add an outside address below.</p>
        ) : null}
        {inspectors.map((m) => (
          <CheckboxField key={m.userId} label={`${m.name} (${m.email})`} value={m.userId} {...form.register('inspectorIds')} />
        ))}
        {errors.inspectorIds ? (
          <p id="send-recipients-error" className="text-sm font-medium text-fault">
            <span aria-hidden="true">⚠ </span>
            {errors.inspectorIds.message ?? errors.inspectorIds.root?.message}
          </p>
        ) : null}
      </fieldset>

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">Outside addresses</legend>
        <p className="text-sm text-ink-soft">
          Someone without a Headroom account, or not yet in this project: they become an inspector of this project, and the e-mail carries an invitation to set
          a password.
        </p>
        {emails.fields.map((field, index) => (
          <div key={field.id} className="grid items-start gap-2 sm:grid-cols-[1fr_auto]">
            <TextField
              label={`Outside address ${index + 1}`}
              type="email"
              autoComplete="off"
              error={errors.emails?.[index]?.address?.message}
              {...form.register(`emails.${index}.address`)}
            />
            <Button variant="quiet" className="sm:mt-6" onClick={() => emails.remove(index)}>
              Remove address {index + 1}
            </Button>
          </div>
        ))}
        {errors.emails?.message ? <p className="text-sm font-medium text-fault">{errors.emails.message}</p> : null}
        <div>
          <Button variant="secondary" onClick={() => emails.append({ address: '' }, { focusName: `emails.${emails.fields.length}.address` })}>
            Add an outside address
          </Button>
        </div>
      </fieldset>

      <TextAreaField
        label="Note to the inspectors (optional)"
        hint="Printed in the e-mail above the link and the attached PDF."
        error={errors.message?.message}
        {...form.register('message')}
      />

      <div aria-live="assertive">
        {unnamedServerError ? (
          <Alert tone="fault" title="Not sent">
            {errorMessage(send.error)}
          </Alert>
        ) : null}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={send.isPending} pendingLabel="Sending…">
          Send the summary
        </Button>
        <Button variant="secondary" onClick={onCancel} disabled={send.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** "Send to inspectors": a modal dialog (the browser's own, so focus stays in it and Escape closes it). */
export function SendSummaryDialog({ ids, revisionNumber, onSent }: { ids: Ids; revisionNumber: number; onSent: (result: SendSummaryResponse) => void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const opener = useRef<HTMLButtonElement>(null);
  const [open, setOpen] = useState(false);

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (open && !el.open) el.showModal();
    if (!open && el.open) el.close();
  }, [open]);

  const close = () => {
    setOpen(false);
    opener.current?.focus();
  };

  return (
    <>
      <Button ref={opener} onClick={() => setOpen(true)} aria-haspopup="dialog">
        Send to inspectors…
      </Button>
      <dialog
        ref={dialog}
        aria-labelledby="send-summary-title"
        onCancel={(event) => {
          event.preventDefault();
          close();
        }}
        className="m-auto w-[min(40rem,calc(100vw-2rem))] rounded-lg border-2 border-rule bg-surface p-6 text-ink shadow-lg backdrop:bg-ink/50"
      >
        {open ? (
          <>
            <h2 id="send-summary-title" className="mb-1 text-xl">
              Send revision {revisionNumber} to inspectors
            </h2>
            <p className="mb-4 text-sm text-ink-soft">
              Each recipient gets an e-mail with the summary PDF attached and a link to the read-only result, and the revision appears in their review inbox.
            </p>
            <SendSummaryForm
              ids={ids}
              revisionNumber={revisionNumber}
              onCancel={close}
              onSent={(result) => {
                close();
                onSent(result);
              }}
            />
          </>
        ) : null}
      </dialog>
    </>
  );
}
