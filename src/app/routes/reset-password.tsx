import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { PlainShell } from '../../components/layout/app-shell';
import { Alert } from '../../components/ui/alert';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { paths } from '../paths';

/** The page a reset e-mail links to: /reset-password?token=… */
export function ResetPasswordRoute() {
  useDocumentTitle('Choose a new password');
  const [search] = useSearchParams();
  const token = search.get('token') ?? '';
  const [done, setDone] = useState<string | null>(null);
  const askAgain = <Link to={paths.forgotPassword.getHref()}>Ask for a new link</Link>;

  return (
    <PlainShell>
      <h1 className="mb-4 text-2xl">Choose a new password</h1>
      {done ? (
        <Alert tone="sound" title="Password changed">
          <p>{done}</p>
          <p className="mt-2">
            <Link to={paths.signIn.getHref()}>Sign in</Link>
          </p>
        </Alert>
      ) : token ? (
        <>
          <p className="mb-4 text-sm text-ink-soft">Every session of your account ends when the new password is set; then sign in with it.</p>
          <ResetPasswordForm token={token} onDone={setDone} invalidLink={askAgain} />
        </>
      ) : (
        <Alert tone="fault" title="This link is incomplete">
          <p>Open the link from the e-mail again, whole, or ask for a new one.</p>
          <p className="mt-2">{askAgain}</p>
        </Alert>
      )}
    </PlainShell>
  );
}
