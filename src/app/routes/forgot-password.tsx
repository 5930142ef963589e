import { Link } from 'react-router-dom';
import { PlainShell } from '../../components/layout/app-shell';
import { ForgotPasswordForm } from '../../features/auth/components/forgot-password-form';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { paths } from '../paths';

export function ForgotPasswordRoute() {
  useDocumentTitle('Forgot your password');
  return (
    <PlainShell>
      <h1 className="mb-2 text-2xl">Forgot your password?</h1>
      <p className="mb-6 text-sm text-ink-soft">
        Enter the e-mail address of your account. We send a link to choose a new password; it works once, for a short time.
      </p>
      <ForgotPasswordForm />
      <p className="mt-6 text-sm">
        <Link to={paths.signIn.getHref()}>Back to sign-in</Link>
      </p>
    </PlainShell>
  );
}
