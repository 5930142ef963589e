import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import type { MessageInfo } from '../../../shared/api/summaries';
import { useRetryMessage } from '../api/retry-message';

const STATE: Record<MessageInfo['status'], { word: string; tone: 'neutral' | 'standpipe' | 'sound' | 'fault' }> = {
  queued: { word: 'Queued', tone: 'standpipe' },
  sending: { word: 'Sending', tone: 'standpipe' },
  sent: { word: 'Sent', tone: 'sound' },
  failed: { word: 'Failed', tone: 'fault' },
};

const KIND: Record<MessageInfo['kind'], string> = {
  summary: 'Summary',
  invitation: 'Invitation',
  'password-reset': 'Password reset',
  'field-change': 'Field change',
  'review-decision': 'Review decision',
};

function StateDetail({ message }: { message: MessageInfo }) {
  if (message.status === 'sent')
    return <>{message.sentAt ? `Delivered to the mail server ${formatDateTime(message.sentAt)}` : 'Delivered to the mail server'}</>;
  if (message.status === 'failed') {
    return (
      <>
        Gave up after {message.attempts} attempt(s). Reason: <span className="font-semibold">{message.lastError ?? 'not given'}</span>
      </>
    );
  }
  if (message.status === 'sending')
    return (
      <>
        Being handed to the mail server (attempt {message.attempts + 1} of {message.maxAttempts})
      </>
    );
  return (
    <>
      {message.attempts === 0 ? 'Waiting for its first attempt' : `Attempt ${message.attempts} of ${message.maxAttempts} failed; trying again`}
      {message.nextAttemptAt ? ` at ${formatDateTime(message.nextAttemptAt)}` : ''}
      {message.lastError ? `. Last reason: ${message.lastError}` : ''}
    </>
  );
}

function RetryButton({ projectId, message }: { projectId: string; message: MessageInfo }) {
  const retry = useRetryMessage();
  return (
    <div className="flex flex-col gap-1">
      <Button
        variant="secondary"
        onClick={() => retry.mutate({ projectId, messageId: message.id })}
        pending={retry.isPending}
        pendingLabel="Queueing…"
        aria-label={`Send again to ${message.toAddress}`}
      >
        Send again
      </Button>
      <div aria-live="assertive">
        {retry.isError ? (
          <Alert tone="fault" title="Not queued again">
            {errorMessage(retry.error)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}

/** The e-mail sent with a summary, newest first, with each one's state: queued, sending, sent, or failed with the reason. */
export function MessagesList({ projectId, messages, canRetry }: { projectId: string; messages: readonly MessageInfo[]; canRetry: boolean }) {
  if (messages.length === 0) return <p className="text-ink-soft">The summary has not been sent yet.</p>;
  const newestFirst = [...messages].sort((a, b) => b.createdAt.localeCompare(a.createdAt));
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" data-testid="messages-table">
        <caption className="sr-only">E-mail sent with this summary and the state of each</caption>
        <thead>
          <tr className="border-b-2 border-rule text-left">
            <th scope="col" className="py-1 pr-3">
              To
            </th>
            <th scope="col" className="py-1 pr-3">
              Message
            </th>
            <th scope="col" className="py-1 pr-3">
              State
            </th>
            <th scope="col" className="py-1 pr-3">
              Details
            </th>
            {canRetry ? (
              <th scope="col" className="py-1">
                <span className="sr-only">Actions</span>
              </th>
            ) : null}
          </tr>
        </thead>
        <tbody aria-live="polite">
          {newestFirst.map((m) => (
            <tr key={m.id} className="border-b border-rule align-top" data-testid="message-row" data-status={m.status}>
              <th scope="row" className="py-2 pr-3 text-left font-normal">
                <span className="font-semibold">{m.toName}</span>
                <span className="block text-ink-soft">{m.toAddress}</span>
              </th>
              <td className="py-2 pr-3">
                {KIND[m.kind]}
                <span className="block text-ink-soft">queued {formatDateTime(m.createdAt)}</span>
              </td>
              <td className="py-2 pr-3">
                <Badge tone={STATE[m.status].tone}>{STATE[m.status].word}</Badge>
              </td>
              <td className="py-2 pr-3">
                <StateDetail message={m} />
              </td>
              {canRetry ? <td className="py-2">{m.status === 'failed' ? <RetryButton projectId={projectId} message={m} /> : null}</td> : null}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
