import { useId, useRef, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { formatDateTime } from '../../../lib/labels';
import type { Invitation } from '../../../shared/api/users';

/**
 * The one-time link, shown once: the administrator copies it and sends it to the person.
 * Until Headroom sends e-mail, this screen (and the server log) is the only place it appears.
 */
export function InvitationLink({ invitation, person, onDismiss }: { invitation: Invitation; person: string; onDismiss: () => void }) {
  const inputId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [copied, setCopied] = useState<string | null>(null);

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(invitation.url);
      setCopied('Link copied.');
    } catch {
      input.current?.select();
      setCopied('Copying was refused by the browser; the link is selected, press Ctrl+C to copy it.');
    }
  };

  return (
    <Alert
      tone="sound"
      title={`Invitation link for ${person}`}
      actions={
        <>
          <Button onClick={copy}>Copy link</Button>
          <Button variant="secondary" onClick={onDismiss}>
            Done
          </Button>
        </>
      }
    >
      <p>
        Send this link to the person: it lets them set a password. It works once, until {formatDateTime(invitation.expiresAt)}, and it is not shown again. Any
        earlier link for this person no longer works.
      </p>
      <label htmlFor={inputId} className="mt-2 block font-semibold">
        Invitation link
      </label>
      <input
        id={inputId}
        ref={input}
        readOnly
        value={invitation.url}
        onFocus={(event) => event.currentTarget.select()}
        className="mt-1 block w-full rounded-md border-2 border-rule-strong bg-surface px-3 py-2 font-mono text-sm"
        data-testid="invitation-url"
      />
      <p aria-live="polite" className="mt-1 text-sm">
        {copied}
      </p>
    </Alert>
  );
}
