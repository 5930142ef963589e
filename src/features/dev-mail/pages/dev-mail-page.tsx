import { useDeferredValue, useState } from 'react';
import { ErrorView } from '../../../components/errors/error-view';
import { Alert } from '../../../components/ui/alert';
import { Section } from '../../../components/ui/card';
import { TextField } from '../../../components/ui/field';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { isNotFound } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import type { DevMail } from '../../../shared/api/summaries';
import { useCurrentUser } from '../../auth/api/use-current-user';
import { formatBytes } from '../../summaries/components/summary-status';
import { DEV_MAIL_LIMIT, useDevMail } from '../api/get-dev-mail';

function MailItem({ mail }: { mail: DevMail }) {
  return (
    <li className="rounded-md border-2 border-rule bg-surface" data-testid="dev-mail-item">
      <details>
        <summary className="cursor-pointer px-4 py-3">
          <span className="font-semibold">{mail.subject || '(no subject)'}</span>
          <span className="block text-sm text-ink-soft">
            To {mail.to || mail.envelopeTo.join(', ')} · {formatDateTime(mail.receivedAt)} · {mail.attachments.length} attachment(s)
          </span>
        </summary>
        <div className="border-t-2 border-rule px-4 py-3">
          <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[10rem_1fr]">
            <dt className="font-semibold">From</dt>
            <dd>{mail.from}</dd>
            <dt className="font-semibold">To</dt>
            <dd>{mail.to}</dd>
            <dt className="font-semibold">Envelope</dt>
            <dd>
              {mail.envelopeFrom} → {mail.envelopeTo.join(', ')}
            </dd>
            <dt className="font-semibold">Message-ID</dt>
            <dd className="break-all">{mail.messageId ?? '—'}</dd>
          </dl>
          <pre className="mt-3 max-h-96 overflow-auto whitespace-pre-wrap rounded bg-paper p-3 text-sm" aria-label={`Text of “${mail.subject}”`}>
            {mail.text}
          </pre>
          {mail.attachments.length > 0 ? (
            <ul className="mt-3 flex flex-col gap-1 text-sm" aria-label={`Attachments of “${mail.subject}”`}>
              {mail.attachments.map((a) => (
                <li key={a.index}>
                  <a href={a.url} download={a.filename}>
                    {a.filename}
                  </a>{' '}
                  <span className="text-ink-soft">
                    ({a.contentType}, {formatBytes(a.size)}, SHA-256 <code className="text-xs">{a.sha256.slice(0, 16)}…</code>)
                  </span>
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      </details>
    </li>
  );
}

function DevMailList() {
  const [to, setTo] = useState('');
  const deferredTo = useDeferredValue(to);
  const mail = useDevMail(deferredTo);

  if (mail.isError && isNotFound(mail.error)) {
    return (
      <Alert tone="caution" title="The development mail page is not enabled">
        This server does not catch e-mail. The page works only when the server runs with HEADROOM_DEV_MAIL=1 and its local mail sink (as <code>npm start</code>{' '}
        and the tests do); in production, e-mail goes to the configured SMTP server.
      </Alert>
    );
  }
  return (
    <Section title="Caught messages">
      <form role="search" className="mb-4 max-w-md" onSubmit={(event) => event.preventDefault()}>
        <TextField label="Only messages to this address" type="search" value={to} onChange={(event) => setTo(event.target.value)} hint="Leave empty for all." />
      </form>
      {mail.isPending ? <Loading label="Loading the caught messages…" /> : null}
      {mail.isError ? <ErrorView error={mail.error} onRetry={() => void mail.refetch()} what="the caught messages" /> : null}
      {mail.data && mail.data.length === 0 ? <p className="text-ink-soft">No messages{deferredTo ? ` to ${deferredTo}` : ''} yet.</p> : null}
      {mail.data && mail.data.length > 0 ? (
        <>
          <p className="mb-2 text-sm text-ink-soft" role="status">
            {mail.data.length} message(s), newest first{mail.data.length === DEV_MAIL_LIMIT ? ` (the newest ${DEV_MAIL_LIMIT} only)` : ''}.
          </p>
          <ul className="flex flex-col gap-2" aria-label="Caught messages">
            {mail.data.map((m) => (
              <MailItem key={m.id} mail={m} />
            ))}
          </ul>
        </>
      ) : null}
    </Section>
  );
}

/** Development only, for administrators: the messages Headroom's local SMTP sink caught, with their attachments. */
export function DevMailPage() {
  useDocumentTitle('Development mail');
  const user = useCurrentUser();
  return (
    <>
      <PageHeader title="Development mail" subtitle="E-mail caught by the local mail sink instead of being delivered. For development and tests only." />
      {user.isAdmin ? (
        <DevMailList />
      ) : (
        <Alert tone="caution" title="For administrators">
          Only administrators read the caught e-mail.
        </Alert>
      )}
    </>
  );
}
