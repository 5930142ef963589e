import { Link, useNavigate, useParams } from 'react-router-dom';
import { PlainShell } from '../../components/layout/app-shell';
import { Alert } from '../../components/ui/alert';
import { Loading } from '../../components/ui/loading';
import { useInvitation } from '../../features/auth/api/get-invitation';
import { InvitationForm } from '../../features/auth/components/invitation-form';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { errorMessage } from '../../lib/error-messages';
import { paths } from '../paths';

export function InvitationRoute() {
  useDocumentTitle('Accept invitation');
  const { token = '' } = useParams();
  const invitation = useInvitation(token);
  const navigate = useNavigate();

  return (
    <PlainShell>
      <h1 className="mb-4 text-2xl">Welcome to Headroom</h1>
      {invitation.isPending ? <Loading label="Checking your invitation…" /> : null}
      {invitation.isError ? (
        <Alert tone="fault" title="This invitation cannot be used">
          <p>{errorMessage(invitation.error)}</p>
          <p className="mt-2">
            <Link to={paths.signIn.getHref()}>Go to sign-in</Link>
          </p>
        </Alert>
      ) : null}
      {invitation.data ? (
        <>
          <p className="mb-4 text-sm text-ink-soft">Choose a password for your account. You are signed in when it is set.</p>
          <InvitationForm token={token} invitation={invitation.data} onAccepted={() => navigate(paths.projects.getHref(), { replace: true })} />
        </>
      ) : null}
    </PlainShell>
  );
}
