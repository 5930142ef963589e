import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import type { FieldChange } from '../../../shared/api/fieldChanges';
import type { Draft } from '../../walk/draft/use-draft';
import { walkPaths } from '../../walk/paths';
import { AcceptFieldChangeBody, DeclineFieldChangeBody, useAcceptFieldChange, useDeclineFieldChange, useProposeFieldChange } from '../api/decide-field-change';
import type { FieldChangeIds } from '../api/urls';

const acceptForm = AcceptFieldChangeBody.omit({ version: true });
const declineForm = DeclineFieldChangeBody.omit({ version: true });

/** The author sends the draft to the project's designers. */
function ProposeForm({ ids, draft, attachmentCount }: { ids: FieldChangeIds; draft: Draft; attachmentCount: number }) {
  const propose = useProposeFieldChange();
  const [preparing, setPreparing] = useState(false);
  const send = async () => {
    setPreparing(true);
    const version = await draft.versionToIssue();
    setPreparing(false);
    if (version !== null) propose.mutate({ ids, version });
  };
  return (
    <div className="flex flex-col gap-3">
      <p className="max-w-prose text-sm">
        Proposing sends this field change to the project’s designers by e-mail. It can then no longer be edited; you can still attach files until the designer
        decides.
        {attachmentCount === 0 ? ' No product data is attached yet.' : ''}
      </p>
      <div>
        <Button onClick={() => void send()} pending={propose.isPending || preparing} pendingLabel="Sending…" disabled={draft.state === 'conflict'}>
          Propose to the designer
        </Button>
      </div>
      <div aria-live="assertive">
        {propose.isError ? (
          <Alert tone="fault" title="Not proposed">
            {errorMessage(propose.error)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}

/** The designer of record accepts (a new draft revision) or declines (with a reason). */
function DecideForms({ ids, fieldChange }: { ids: FieldChangeIds; fieldChange: FieldChange }) {
  const accept = useAcceptFieldChange();
  const decline = useDeclineFieldChange();
  const navigate = useNavigate();
  const [mode, setMode] = useState<'accept' | 'decline'>('accept');
  const a = useForm({ resolver: zodResolver(acceptForm), defaultValues: { comment: '' } });
  const d = useForm({ resolver: zodResolver(declineForm), defaultValues: { reason: '' } });
  const onAccept = a.handleSubmit(({ comment }) =>
    accept.mutate(
      { ids, body: { version: fieldChange.version, comment: comment || undefined } },
      { onSuccess: ({ revision }) => navigate(walkPaths.step.getHref(ids.projectId, ids.systemId, revision.id, 'result')) },
    ),
  );
  const onDecline = d.handleSubmit(({ reason }) => decline.mutate({ ids, body: { version: fieldChange.version, reason } }));
  const canAccept = fieldChange.baseIsCurrent;
  return (
    <div className="flex flex-col gap-4">
      {canAccept ? (
        <div role="radiogroup" aria-label="Decision" className="flex gap-4">
          <label className="flex items-center gap-2">
            <input type="radio" name="decision" checked={mode === 'accept'} onChange={() => setMode('accept')} /> Accept
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" name="decision" checked={mode === 'decline'} onChange={() => setMode('decline')} /> Decline
          </label>
        </div>
      ) : (
        <Alert tone="caution" title="The issued revision has moved on">
          This field change was made on a revision that is no longer the current issued one, so it cannot be accepted as it is. Decline it with a reason, and
          ask for a new one on the current revision.
        </Alert>
      )}
      {canAccept && mode === 'accept' ? (
        <form onSubmit={onAccept} noValidate className="flex flex-col gap-3" aria-label="Accept the field change">
          <p className="max-w-prose text-sm">
            Accepting makes a new draft revision from this field change, with the change recorded in its history; check it and issue it as usual. The contractor
            is told by e-mail.
          </p>
          <TextAreaField label="Comment for the contractor (optional)" error={a.formState.errors.comment?.message} {...a.register('comment')} />
          <div>
            <Button type="submit" pending={accept.isPending} pendingLabel="Accepting…">
              Accept into a new draft revision
            </Button>
          </div>
        </form>
      ) : null}
      {mode === 'decline' || !canAccept ? (
        <form onSubmit={onDecline} noValidate className="flex flex-col gap-3" aria-label="Decline the field change">
          <TextAreaField
            label="Why it is declined"
            hint="The contractor receives this by e-mail."
            error={d.formState.errors.reason?.message}
            {...d.register('reason')}
          />
          <div>
            <Button type="submit" variant="danger" pending={decline.isPending} pendingLabel="Declining…">
              Decline
            </Button>
          </div>
        </form>
      ) : null}
      <div aria-live="assertive">
        {accept.isError ? (
          <Alert tone="fault" title="Not accepted">
            {errorMessage(accept.error)}
          </Alert>
        ) : null}
        {decline.isError ? (
          <Alert tone="fault" title="Not declined">
            {errorMessage(decline.error)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}

/** Where the field change stands, and what this person can do about it now. */
export function DecisionPanel({
  ids,
  fieldChange,
  draft,
  isAuthor,
  isDesigner,
}: {
  ids: FieldChangeIds;
  fieldChange: FieldChange;
  draft: Draft;
  isAuthor: boolean;
  isDesigner: boolean;
}) {
  const fc = fieldChange;
  return (
    <Section title="Proposal" headingLevel={3}>
      <dl className="mb-4 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="font-semibold">Started</dt>
        <dd>
          {fc.createdBy.name}, {formatDateTime(fc.createdAt)}
        </dd>
        {fc.proposedAt ? (
          <>
            <dt className="font-semibold">Proposed</dt>
            <dd>{formatDateTime(fc.proposedAt)}</dd>
          </>
        ) : null}
        {fc.decidedAt && fc.decidedBy ? (
          <>
            <dt className="font-semibold">{fc.status === 'accepted' ? 'Accepted' : 'Declined'}</dt>
            <dd>
              {fc.decidedBy.name}, {formatDateTime(fc.decidedAt)}
            </dd>
          </>
        ) : null}
      </dl>
      {fc.status === 'draft' && isAuthor ? <ProposeForm ids={ids} draft={draft} attachmentCount={fc.attachmentCount} /> : null}
      {fc.status === 'draft' && !isAuthor ? <p>{fc.createdBy.name} has not proposed this field change yet.</p> : null}
      {fc.status === 'proposed' && isDesigner ? <DecideForms ids={ids} fieldChange={fc} /> : null}
      {fc.status === 'proposed' && !isDesigner ? <p data-testid="proposal-state">Sent to the project’s designers; waiting for their decision.</p> : null}
      {fc.status === 'accepted' && fc.acceptedRevision ? (
        <p data-testid="proposal-state">
          Accepted into{' '}
          <Link to={walkPaths.step.getHref(ids.projectId, ids.systemId, fc.acceptedRevision.id, 'result')}>revision {fc.acceptedRevision.number}</Link>.
        </p>
      ) : null}
      {fc.status === 'declined' ? (
        <Alert tone="caution" title="Declined">
          <span data-testid="decline-reason">{fc.declineReason}</span>
        </Alert>
      ) : null}
    </Section>
  );
}
